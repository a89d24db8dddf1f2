/**
 * POST /api/scenarios/:scenarioId/save-change: the Outlook's "Save as a new scenario" for a tried pack or
 * array. One transaction makes a copy of the vehicle with the tried plan's equipment and the new scenario
 * on it; the copy is shared with the original's crew when the saver can change the original; bad input is
 * refused naming the field, and nothing is created.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { copyName } from '../../server/modules/exchange/exchange.service'
import { testContext } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import type { Plan } from '../../shared/schemas/plan'
import type { VehicleRole } from '../../shared/schemas/vehicles'
import {
  addMember,
  caller,
  fridge,
  inverter,
  laptop,
  lfpBattery,
  solar,
  vehicleInput,
  winterTrip,
} from './vehicles.fixtures'

const ctx = testContext()
const app = createApp(ctx)
const call = caller(app)
afterAll(() => ctx.pool.end())

type Who = VehicleRole | 'stranger'
const people = {} as Record<Who, TestUser>
let vehicleId: string
let scenarioId: string
let stored: Plan

/**
 * The plan without the database's ids and the plan's label (vehicle and scenario names), to compare the
 * copy's equipment and trip with what was tried.
 */
const withoutIds = ({ name: _name, ...p }: Plan) => ({
  ...p,
  appliances: p.appliances.map(({ id: _id, ...a }) => a),
  sources: p.sources.map(({ id: _id, ...s }) => s),
})

beforeAll(async () => {
  for (const who of ['owner', 'editor', 'viewer', 'advisor', 'stranger'] as const)
    people[who] = await createUser(ctx)
  const owner = call(people.owner)
  vehicleId = (await owner('post', '/api/vehicles', vehicleInput).expect(201)).body.id
  for (const role of ['editor', 'viewer', 'advisor'] as const)
    await addMember(ctx, vehicleId, people[role].id, role)
  await owner('put', `/api/vehicles/${vehicleId}/battery`, { version: 0, battery: lfpBattery }).expect(200)
  const fridgeId = (await owner('post', `/api/vehicles/${vehicleId}/appliances`, fridge).expect(201)).body.id
  await owner('post', `/api/vehicles/${vehicleId}/appliances`, laptop).expect(201)
  await owner('put', `/api/vehicles/${vehicleId}/inverter`, { version: 0, inverter }).expect(200)
  await owner('post', `/api/vehicles/${vehicleId}/sources`, solar).expect(201)
  scenarioId = (
    await owner('post', `/api/vehicles/${vehicleId}/scenarios`, {
      name: 'Winter',
      placeName: 'Lofoten',
      trip: winterTrip,
      usage: { [fridgeId]: { dutyCycleFraction: 0.45 } },
    }).expect(201)
  ).body.id
  stored = (await owner('get', `/api/scenarios/${scenarioId}/plan`).expect(200)).body
})

/** The stored plan with a bigger pack and array, as the Outlook's "Try a change" makes it. */
function tried(): Plan {
  return {
    ...stored,
    battery: { ...stored.battery, capacityAh: 330 },
    sources: stored.sources.map((s) => (s.kind === 'solar' ? { ...s, peakPowerWp: 600 } : s)),
  }
}

const vehicleCount = async (who: Who) =>
  (await call(people[who])('get', '/api/vehicles').expect(200)).body.total as number

describe('saving a tried pack and array on a copy of the vehicle', () => {
  it('copies the vehicle with the tried equipment and puts the new scenario, with its usage, on it', async () => {
    const owner = call(people.owner)
    const plan = tried()
    const res = await owner('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: 'Winter · 330 Ah, 600 Wp',
      plan,
    }).expect(201)
    expect(res.body.vehicleId).not.toBe(vehicleId)
    expect(res.body.scenario.vehicleId).toBe(res.body.vehicleId)
    expect(res.body.scenario.name).toBe('Winter · 330 Ah, 600 Wp')
    expect(res.body.scenario.placeName).toBe('Lofoten')
    const copy = (await owner('get', `/api/vehicles/${res.body.vehicleId}`).expect(200)).body
    expect(copy.name).toBe('Test van (Winter · 330 Ah, 600 Wp)')
    expect(copy.systemVoltageV).toBe(12)
    expect(copy.myRole).toBe('owner')
    // The copy's scenario runs exactly the tried plan: same equipment in the same order, same usage, same trip.
    const saved: Plan = (await owner('get', `/api/scenarios/${res.body.scenario.id}/plan`).expect(200)).body
    expect(withoutIds(saved)).toEqual(withoutIds(plan))
    expect(saved.battery.capacityAh).toBe(330)
    expect(saved.inverter).toEqual(stored.inverter)
    expect(saved.appliances.find((a) => a.name === fridge.name)!.usage).toEqual({ dutyCycleFraction: 0.45 })
    // The original is as it was.
    const original: Plan = (await owner('get', `/api/scenarios/${scenarioId}/plan`).expect(200)).body
    expect(original).toEqual(stored)
    // The copy's history says where it came from.
    const history = (await owner('get', `/api/vehicles/${res.body.vehicleId}/history`).expect(200)).body
    const summaries = (history.items as { summary: string }[]).map((h) => h.summary).join('\n')
    // A copy, not an import of a file.
    const took = (history.items as { summary: string; action: string }[]).find((h) =>
      h.summary.startsWith('Took the tried equipment'),
    )
    expect(took?.action).toBe('duplicate')
    expect(summaries).toContain('Created vehicle')
    expect(summaries).toContain('Took the tried equipment from the Outlook of “Winter”')
  })

  it('shares the copy with the crew when the saver can change the original; advisors are not carried over', async () => {
    const res = await call(people.editor)('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: 'Editor try',
      plan: tried(),
    }).expect(201)
    const id = res.body.scenario.id as string
    const roleOf = async (who: Who) => {
      const r = await call(people[who])('get', `/api/scenarios/${id}`)
      return r.status === 200 ? (r.body.myRole as string) : r.status
    }
    expect(await roleOf('editor')).toBe('owner')
    expect(await roleOf('owner')).toBe('editor')
    expect(await roleOf('viewer')).toBe('viewer')
    expect(await roleOf('advisor')).toBe(404)
    expect(await roleOf('stranger')).toBe(404)
  })

  it('gives an advisor reviewing the plan a copy of their own, which the crew does not see', async () => {
    const res = await call(people.advisor)('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: 'Advisor try',
      plan: tried(),
    }).expect(201)
    const id = res.body.scenario.id as string
    expect((await call(people.advisor)('get', `/api/scenarios/${id}`).expect(200)).body.myRole).toBe('owner')
    await call(people.owner)('get', `/api/scenarios/${id}`).expect(404)
  })

  it('names the copy within the limit without cutting a character in half', () => {
    expect(copyName('Blue van', 'Winter · 330 Ah')).toBe('Blue van (Winter · 330 Ah)')
    const long = copyName('🚐'.repeat(100), 'Winter · 330 Ah')
    expect([...long].length).toBeLessThanOrEqual(120)
    expect(long.endsWith(' (Winter · 330 Ah)')).toBe(true)
    expect(long.startsWith('🚐')).toBe(true)
    expect([...long].every((c) => c.codePointAt(0)! < 0xd800 || c.codePointAt(0)! > 0xdfff)).toBe(true)
    const both = copyName('Van', 'x'.repeat(120))
    expect([...both].length).toBeLessThanOrEqual(120)
    expect(both.endsWith(')')).toBe(true)
  })

  it('gives a reader who cannot change the original a copy of their own', async () => {
    const res = await call(people.viewer)('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: 'Viewer try',
      plan: tried(),
    }).expect(201)
    const id = res.body.scenario.id as string
    expect((await call(people.viewer)('get', `/api/scenarios/${id}`).expect(200)).body.myRole).toBe('owner')
    await call(people.owner)('get', `/api/scenarios/${id}`).expect(404)
    await call(people.editor)('get', `/api/scenarios/${id}`).expect(404)
  })

  it('answers 404 to someone who cannot read the scenario, and creates nothing', async () => {
    const before = await vehicleCount('stranger')
    await call(people.stranger)('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: 'Not mine',
      plan: tried(),
    }).expect(404)
    expect(await vehicleCount('stranger')).toBe(before)
  })

  it('refuses a plan that is not valid, naming the field inside the plan, and creates nothing', async () => {
    const before = await vehicleCount('owner')
    const plan = tried()
    const bad = { ...plan, battery: { ...plan.battery, capacityAh: -5 } }
    const res = await call(people.owner)('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: 'Bad',
      plan: bad,
    }).expect(400)
    expect(res.body.error.code).toBe('validation_failed')
    expect(Object.keys(res.body.error.fields)).toEqual(['plan.battery.capacityAh'])
    const missing = await call(people.owner)('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: 'No plan',
    }).expect(400)
    expect(missing.body.error.fields.plan[0]).toMatch(/required/)
    expect(await vehicleCount('owner')).toBe(before)
  })

  it('leaves nothing behind when the last step fails: the copy is one transaction', async () => {
    // A database trigger makes the new scenario's insert fail, after the vehicle, its crew and its equipment
    // were written in the same transaction (for this scenario name only; the test database is shared).
    const NAME = `Fails at the scenario ${Math.random().toString(36).slice(2)}`
    await ctx.pool.query(`
      CREATE OR REPLACE FUNCTION ow_test_fail_scenario() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NEW.name = '${NAME}' THEN RAISE EXCEPTION 'test: scenario insert refused'; END IF;
        RETURN NEW;
      END $$;
      CREATE TRIGGER ow_test_fail_scenario BEFORE INSERT ON scenarios
        FOR EACH ROW EXECUTE FUNCTION ow_test_fail_scenario();`)
    try {
      const vehiclesBefore = await vehicleCount('owner')
      const editorBefore = await vehicleCount('editor')
      const res = await call(people.owner)('post', `/api/scenarios/${scenarioId}/save-change`, {
        name: NAME,
        plan: tried(),
      })
      expect(res.status).toBe(500)
      expect(res.body.error.code).toBeTruthy()
      expect(await vehicleCount('owner')).toBe(vehiclesBefore)
      expect(await vehicleCount('editor')).toBe(editorBefore)
      // No copy under any owner, and so no equipment on one.
      const { rows } = await ctx.pool.query(
        'SELECT count(*)::int AS n FROM vehicles WHERE strpos(name, $1) > 0',
        [NAME],
      )
      expect(rows[0].n).toBe(0)
    } finally {
      await ctx.pool.query(
        'DROP TRIGGER IF EXISTS ow_test_fail_scenario ON scenarios; DROP FUNCTION IF EXISTS ow_test_fail_scenario();',
      )
    }
  })

  it('refuses an appliance row that would not fit its own hours, as the appliance list does', async () => {
    const before = await vehicleCount('owner')
    const plan = tried()
    const i = plan.appliances.findIndex((a) => a.name === laptop.name)
    plan.appliances[i] = {
      ...plan.appliances[i]!,
      hoursPerDay: 10,
      startHour: 8,
      endHour: 12,
      usage: { hoursPerDay: 2 },
    }
    const res = await call(people.owner)('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: 'Squeezed',
      plan,
    }).expect(400)
    expect(Object.keys(res.body.error.fields)).toEqual([`plan.appliances.${i}.hoursPerDay`])
    expect(await vehicleCount('owner')).toBe(before)
  })

  it('refuses an empty name or an unknown field, naming it', async () => {
    const before = await vehicleCount('owner')
    const empty = await call(people.owner)('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: '  ',
      plan: tried(),
    }).expect(400)
    expect(empty.body.error.fields.name[0]).toMatch(/empty/)
    const extra = await call(people.owner)('post', `/api/scenarios/${scenarioId}/save-change`, {
      name: 'x',
      plan: tried(),
      vehicle: 'y',
    }).expect(400)
    expect(Object.keys(extra.body.error.fields)).toContain('vehicle')
    expect(await vehicleCount('owner')).toBe(before)
  })
})
