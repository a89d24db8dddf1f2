/**
 * /api/scenarios and /api/vehicles/:id/scenarios: create/read/update/delete, per-appliance usage,
 * duplicate, stale version 409, the assembled engine plan, and the cross-vehicle list.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import { PlanSchema } from '../../shared/schemas/plan'
import { ScenarioListSchema, ScenarioSchema } from '../../shared/schemas/vehicles'
import { buildPlanForScenario } from '../../server/modules/scenarios/plan'
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
let ines: TestUser
let as: ReturnType<typeof call>
afterAll(() => ctx.pool.end())
beforeAll(async () => {
  ines = await createUser(ctx)
  as = call(ines)
})

/** A vehicle with a fridge and a laptop; battery/inverter/solar only when asked. */
async function vehicle(opts: { equipped?: boolean } = {}) {
  const id = (await as('post', '/api/vehicles', vehicleInput).expect(201)).body.id as string
  const fridgeId = (await as('post', `/api/vehicles/${id}/appliances`, fridge).expect(201)).body.id as string
  const laptopId = (await as('post', `/api/vehicles/${id}/appliances`, laptop).expect(201)).body.id as string
  if (opts.equipped) {
    await as('put', `/api/vehicles/${id}/battery`, { version: 0, battery: lfpBattery }).expect(200)
    await as('put', `/api/vehicles/${id}/inverter`, { version: 0, inverter }).expect(200)
    await as('post', `/api/vehicles/${id}/sources`, solar).expect(201)
  }
  return { id, fridgeId, laptopId }
}

describe('scenarios', () => {
  it('creates, reads, changes and deletes a scenario with per-appliance usage', async () => {
    const v = await vehicle()
    const created = await as('post', `/api/vehicles/${v.id}/scenarios`, {
      name: 'Winter week',
      placeName: 'Svolvær, NO',
      trip: winterTrip,
      usage: { [v.laptopId]: { enabled: false } },
    }).expect(201)
    const s = ScenarioSchema.parse(created.body)
    expect(s).toMatchObject({
      name: 'Winter week',
      vehicleId: v.id,
      myRole: 'owner',
      version: 1,
      placeName: 'Svolvær, NO',
    })
    expect(s.usage).toEqual({ [v.laptopId]: { enabled: false } })
    expect(s.trip).toEqual(winterTrip)

    const got = ScenarioSchema.parse((await as('get', `/api/scenarios/${s.id}`).expect(200)).body)
    expect(got).toEqual(s)

    const patched = await as('patch', `/api/scenarios/${s.id}`, {
      version: 1,
      trip: { ...winterTrip, nightLowC: -15 },
      usage: { [v.fridgeId]: { dutyCycleFraction: 0.2 } },
    }).expect(200)
    expect(patched.body).toMatchObject({
      version: 2,
      trip: { nightLowC: -15 },
      usage: { [v.fridgeId]: { dutyCycleFraction: 0.2 } },
    })
    expect(patched.body.usage).not.toHaveProperty(v.laptopId)

    const list = ScenarioListSchema.parse(
      (await as('get', `/api/vehicles/${v.id}/scenarios`).expect(200)).body,
    )
    expect(list.items).toEqual([
      expect.objectContaining({ id: s.id, nightLowC: -15, days: 3, timeZone: 'Europe/Oslo' }),
    ])

    await as('delete', `/api/scenarios/${s.id}?version=1`).expect(409)
    await as('delete', `/api/scenarios/${s.id}?version=2`).expect(204)
    await as('get', `/api/scenarios/${s.id}`).expect(404)
  })

  it('names invalid trip fields and usage of appliances that are not this vehicle’s', async () => {
    const v = await vehicle()
    const other = await vehicle()
    const bad = await as('post', `/api/vehicles/${v.id}/scenarios`, {
      name: 'Bad',
      trip: { ...winterTrip, nightLowC: -100, timeZone: 'Mars/Olympus', startDate: '2027-02-30' },
    }).expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual([
      'trip.nightLowC',
      'trip.startDate',
      'trip.timeZone',
    ])
    expect(bad.body.error.fields['trip.startDate']).toEqual(['is not a real calendar date'])

    const foreign = await as('post', `/api/vehicles/${v.id}/scenarios`, {
      name: 'Foreign usage',
      trip: winterTrip,
      usage: { [other.fridgeId]: { enabled: false }, [v.fridgeId]: { hoursPerDay: 30 } },
    }).expect(400)
    expect(foreign.body.error.fields).toEqual({
      [`usage.${v.fridgeId}.hoursPerDay`]: ['must be between 0 and 24'],
    })

    const foreign2 = await as('post', `/api/vehicles/${v.id}/scenarios`, {
      name: 'Foreign usage',
      trip: winterTrip,
      usage: { [other.fridgeId]: { enabled: false } },
    }).expect(400)
    expect(foreign2.body.error.fields).toEqual({
      [`usage.${other.fridgeId}`]: ['is not an appliance of this vehicle'],
    })
    expect((await as('get', `/api/vehicles/${v.id}/scenarios`).expect(200)).body.total).toBe(0)
  })

  it('refuses a stale update with 409 and the current scenario, and changes nothing', async () => {
    const v = await vehicle()
    const s = (
      await as('post', `/api/vehicles/${v.id}/scenarios`, { name: 'Summer', trip: winterTrip }).expect(201)
    ).body
    const tomas = await createUser(ctx)
    await addMember(ctx, v.id, tomas.id, 'editor')
    await call(tomas)('patch', `/api/scenarios/${s.id}`, { version: 1, name: 'Summer (Tomas)' }).expect(200)
    const stale = await as('patch', `/api/scenarios/${s.id}`, {
      version: 1,
      name: 'Summer (Ines)',
      usage: { [v.fridgeId]: { enabled: false } },
    }).expect(409)
    expect(stale.body.error).toMatchObject({
      code: 'conflict',
      current: { name: 'Summer (Tomas)', version: 2, usage: {} },
    })
    expect(stale.body.error.current.updatedBy.id).toBe(tomas.id)
    const now = (await as('get', `/api/scenarios/${s.id}`).expect(200)).body
    expect(now).toMatchObject({ name: 'Summer (Tomas)', version: 2, usage: {} })
  })

  it('duplicates a scenario with its usage under a new name', async () => {
    const v = await vehicle()
    const summer = (
      await as('post', `/api/vehicles/${v.id}/scenarios`, {
        name: 'Summer',
        notes: 'hot',
        trip: winterTrip,
        usage: { [v.fridgeId]: { dutyCycleFraction: 0.5 } },
      }).expect(201)
    ).body
    const copy = ScenarioSchema.parse(
      (
        await as('post', `/api/scenarios/${summer.id}/duplicate`, { name: 'Winter copy of summer' }).expect(
          201,
        )
      ).body,
    )
    expect(copy.id).not.toBe(summer.id)
    expect(copy).toMatchObject({
      name: 'Winter copy of summer',
      notes: 'hot',
      version: 1,
      trip: summer.trip,
      usage: summer.usage,
    })
    // the copy is independent
    await as('patch', `/api/scenarios/${copy.id}`, { version: 1, usage: {} }).expect(200)
    expect((await as('get', `/api/scenarios/${summer.id}`).expect(200)).body.usage).toEqual(summer.usage)
    const bad = await as('post', `/api/scenarios/${summer.id}/duplicate`, { name: '  ' }).expect(400)
    expect(bad.body.error.fields.name).toEqual(['must not be empty'])
  })

  it('duplicates with a tried trip in the same request, and refuses a bad trip naming the field', async () => {
    const v = await vehicle()
    const s = (
      await as('post', `/api/vehicles/${v.id}/scenarios`, { name: 'S', trip: winterTrip }).expect(201)
    ).body
    const tried = { ...winterTrip, nightLowC: -20, sky: 'overcast' as const }
    const copy = (
      await as('post', `/api/scenarios/${s.id}/duplicate`, { name: 'S · colder', trip: tried }).expect(201)
    ).body
    expect(copy.trip).toEqual(tried)
    expect((await as('get', `/api/scenarios/${s.id}`).expect(200)).body.trip).toEqual(s.trip)
    const before = (await as('get', `/api/vehicles/${v.id}/scenarios`).expect(200)).body.total
    const bad = await as('post', `/api/scenarios/${s.id}/duplicate`, {
      name: 'Bad',
      trip: { ...winterTrip, days: 0 },
    }).expect(400)
    expect(Object.keys(bad.body.error.fields)).toContain('trip.days')
    expect((await as('get', `/api/vehicles/${v.id}/scenarios`).expect(200)).body.total).toBe(before)
  })

  it('drops an appliance’s usage when the appliance is removed', async () => {
    const v = await vehicle()
    const s = (
      await as('post', `/api/vehicles/${v.id}/scenarios`, {
        name: 'S',
        trip: winterTrip,
        usage: { [v.fridgeId]: { enabled: false }, [v.laptopId]: { hoursPerDay: 1 } },
      }).expect(201)
    ).body
    await as('delete', `/api/vehicles/${v.id}/appliances/${v.fridgeId}?version=1`).expect(204)
    expect((await as('get', `/api/scenarios/${s.id}`).expect(200)).body.usage).toEqual({
      [v.laptopId]: { hoursPerDay: 1 },
    })
  })

  it('lists every scenario I can read across vehicles, paginated, filterable by vehicle', async () => {
    const me = await createUser(ctx)
    const mine = call(me)
    const a = (await mine('post', '/api/vehicles', { ...vehicleInput, name: 'A' }).expect(201)).body.id
    const b = (await as('post', '/api/vehicles', { ...vehicleInput, name: 'B' }).expect(201)).body.id
    const hidden = (await as('post', '/api/vehicles', { ...vehicleInput, name: 'Hidden' }).expect(201)).body
      .id
    await addMember(ctx, b, me.id, 'advisor')
    await mine('post', `/api/vehicles/${a}/scenarios`, { name: 'A1', trip: winterTrip }).expect(201)
    await mine('post', `/api/vehicles/${a}/scenarios`, { name: 'A2', trip: winterTrip }).expect(201)
    await as('post', `/api/vehicles/${b}/scenarios`, { name: 'B1', trip: winterTrip }).expect(201)
    await as('post', `/api/vehicles/${hidden}/scenarios`, { name: 'H1', trip: winterTrip }).expect(201)

    const all = ScenarioListSchema.parse((await mine('get', '/api/scenarios').expect(200)).body)
    expect(all.total).toBe(3)
    expect(all.items.map((s) => s.name).sort()).toEqual(['A1', 'A2', 'B1'])
    expect(all.items.find((s) => s.name === 'B1')).toMatchObject({ vehicleName: 'B', myRole: 'advisor' })
    const page = ScenarioListSchema.parse(
      (await mine('get', '/api/scenarios?limit=2&offset=2').expect(200)).body,
    )
    expect(page.items).toHaveLength(1)
    expect(page.total).toBe(3)
    const past = ScenarioListSchema.parse(
      (await mine('get', '/api/scenarios?limit=2&offset=10').expect(200)).body,
    )
    expect(past).toMatchObject({ items: [], total: 3 })
    const pastOfB = ScenarioListSchema.parse(
      (await mine('get', `/api/scenarios?vehicleId=${b}&offset=5`).expect(200)).body,
    )
    expect(pastOfB).toMatchObject({ items: [], total: 1 })
    expect(all.items.find((s) => s.name === 'A1')!.updatedBy).toEqual({
      id: me.id,
      displayName: me.displayName,
    })
    const onlyB = ScenarioListSchema.parse(
      (await mine('get', `/api/scenarios?vehicleId=${b}`).expect(200)).body,
    )
    expect(onlyB.items.map((s) => s.name)).toEqual(['B1'])
    expect((await mine('get', `/api/scenarios?vehicleId=${hidden}`).expect(200)).body.total).toBe(0)
  })
})

describe('GET /api/scenarios/:id/plan', () => {
  it('answers 422 naming the battery while the vehicle has none', async () => {
    const v = await vehicle()
    const s = (
      await as('post', `/api/vehicles/${v.id}/scenarios`, { name: 'S', trip: winterTrip }).expect(201)
    ).body
    const res = await as('get', `/api/scenarios/${s.id}/plan`).expect(422)
    expect(res.body.error.code).toBe('plan_incomplete')
    expect(Object.keys(res.body.error.fields)).toEqual(['battery'])
  })

  it('names the appliance by id when an AC appliance has no inverter', async () => {
    const v = await vehicle()
    await as('put', `/api/vehicles/${v.id}/battery`, { version: 0, battery: lfpBattery }).expect(200)
    const s = (
      await as('post', `/api/vehicles/${v.id}/scenarios`, { name: 'S', trip: winterTrip }).expect(201)
    ).body
    const res = await as('get', `/api/scenarios/${s.id}/plan`).expect(422)
    expect(res.body.error.fields).toEqual({
      [`appliances.${v.laptopId}.supply`]: ['is ac but the plan has no inverter'],
    })
    // switching the laptop off for this trip makes the plan valid
    await as('patch', `/api/scenarios/${s.id}`, {
      version: 1,
      usage: { [v.laptopId]: { enabled: false } },
    }).expect(200)
    await as('get', `/api/scenarios/${s.id}/plan`).expect(200)
  })

  it('assembles equipment, trip and usage into a valid engine plan', async () => {
    const v = await vehicle({ equipped: true })
    const s = (
      await as('post', `/api/vehicles/${v.id}/scenarios`, {
        name: 'Winter',
        trip: winterTrip,
        usage: { [v.fridgeId]: { dutyCycleFraction: 0.2 } },
      }).expect(201)
    ).body
    const res = await as('get', `/api/scenarios/${s.id}/plan`).expect(200)
    const plan = PlanSchema.parse(res.body)
    expect(plan.name).toBe('Test van · Winter')
    expect(plan.battery).toEqual(lfpBattery)
    expect(plan.inverter).toEqual(inverter)
    expect(plan.trip).toEqual(winterTrip)
    expect(plan.appliances.map((a) => a.id)).toEqual([v.fridgeId, v.laptopId])
    expect(plan.appliances[0]).toMatchObject({ ...fridge, usage: { dutyCycleFraction: 0.2 } })
    expect(plan.appliances[1]).not.toHaveProperty('usage')
    expect(plan.sources).toEqual([expect.objectContaining({ ...solar })])
    // the service others import gives the same plan
    expect(await buildPlanForScenario(ctx.db, s.id)).toEqual(plan)
  })
})
