import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { createApp } from '../../server/app'
import { testContext, uniq } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import { analysePlan, parsePlan, resultsToJson } from '../../shared/engine/index'
import { clearResultsCache } from '../../server/modules/results/results.service'
import { loadPlanDigestForReader } from '../../server/modules/scenarios/plan'
import { examplePlan, storePlan, type Send } from './results.fixture'

const ctx = testContext()
const app = createApp(ctx)
afterAll(() => ctx.pool.end())

const sender =
  (user: TestUser): Send =>
  async (method, path, body) => {
    const req = request(app)
      [method.toLowerCase() as 'get' | 'post' | 'put' | 'patch'](path)
      .set('Cookie', user.cookie)
    const res = body === undefined ? await req : await req.send(body as object)
    return { status: res.status, body: res.body }
  }

describe('GET /api/scenarios/:scenarioId/results', () => {
  let owner: TestUser
  let stranger: TestUser
  let winter: { vehicleId: string; scenarioId: string }

  beforeAll(async () => {
    owner = await createUser(ctx)
    stranger = await createUser(ctx)
    winter = await storePlan(sender(owner), examplePlan('winter-week-lofoten'), {
      vehicle: `Van ${uniq()}`,
      scenario: 'Winter week',
    })
  })

  it('answers 401 without a session', async () => {
    const res = await request(app).get(`/api/scenarios/${winter.scenarioId}/results`)
    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('unauthorized')
  })

  it('answers 404 to someone who is not on the vehicle, like a scenario that does not exist', async () => {
    const res = await request(app)
      .get(`/api/scenarios/${winter.scenarioId}/results`)
      .set('Cookie', stranger.cookie)
    expect(res.status).toBe(404)
    const missing = await request(app)
      .get('/api/scenarios/00000000-0000-4000-8000-000000000000/results')
      .set('Cookie', owner.cookie)
    expect(missing.status).toBe(404)
  })

  it('gives exactly what the engine gives for the same plan JSON in this process (browser-vs-server identity)', async () => {
    clearResultsCache()
    const planRes = await request(app)
      .get(`/api/scenarios/${winter.scenarioId}/plan`)
      .set('Cookie', owner.cookie)
    expect(planRes.status).toBe(200)
    const res = await request(app)
      .get(`/api/scenarios/${winter.scenarioId}/results`)
      .set('Cookie', owner.cookie)
    expect(res.status).toBe(200)
    expect(res.body.scenarioId).toBe(winter.scenarioId)
    expect(res.body.cached).toBe(false)

    // The browser receives the plan as JSON, validates it with the same schema and runs the same engine.
    const parsed = parsePlan(JSON.parse(JSON.stringify(planRes.body)))
    expect(parsed.ok).toBe(true)
    if (!parsed.ok) return
    const local = JSON.parse(JSON.stringify(resultsToJson(analysePlan(parsed.plan))))
    expect(res.body.results).toEqual(local)
    expect(JSON.stringify(res.body.results)).toBe(JSON.stringify(local))

    // Sanity: these are real results of this trip, not an empty shell.
    expect(res.body.results.days).toHaveLength(7)
    expect(res.body.results.series.socEndFraction).toHaveLength(7 * 24)
    expect(['carries', 'tight', 'short']).toContain(res.body.results.verdict.status)
    expect(res.body.results.packNeeded.capacityAh).toBeGreaterThan(0)

    const again = await request(app)
      .get(`/api/scenarios/${winter.scenarioId}/results`)
      .set('Cookie', owner.cookie)
    expect(again.body.cached).toBe(true)
    expect(again.body.results).toEqual(res.body.results)
  })

  it('follows an edit of the stored scenario (the memo is keyed by the plan)', async () => {
    const before = await request(app)
      .get(`/api/scenarios/${winter.scenarioId}/results`)
      .set('Cookie', owner.cookie)
    const sc = await request(app).get(`/api/scenarios/${winter.scenarioId}`).set('Cookie', owner.cookie)
    const trip = {
      ...sc.body.trip,
      nightLowC: sc.body.trip.nightLowC - 10,
      dayHighC: sc.body.trip.dayHighC - 10,
    }
    const patched = await request(app)
      .patch(`/api/scenarios/${winter.scenarioId}`)
      .set('Cookie', owner.cookie)
      .send({ version: sc.body.version, trip })
    expect(patched.status).toBe(200)
    const after = await request(app)
      .get(`/api/scenarios/${winter.scenarioId}/results`)
      .set('Cookie', owner.cookie)
    expect(after.body.cached).toBe(false)
    expect(after.body.results.plan.trip.nightLowC).toBe(trip.nightLowC)
    expect(after.body.results.summary.heaterWh).toBeGreaterThan(before.body.results.summary.heaterWh)
  })

  it('answers 422 plan_incomplete for a vehicle without a battery bank', async () => {
    const s = sender(owner)
    const v = await s('POST', '/api/vehicles', { name: `Bare ${uniq()}`, kind: 'van', systemVoltageV: 12 })
    const plan = examplePlan('summer-month-andalusia')
    const sc = await s('POST', `/api/vehicles/${v.body.id}/scenarios`, {
      name: 'No pack yet',
      trip: plan.trip,
    })
    expect(sc.status).toBe(201)
    const res = await request(app).get(`/api/scenarios/${sc.body.id}/results`).set('Cookie', owner.cookie)
    expect(res.status).toBe(422)
    expect(res.body.error.code).toBe('plan_incomplete')
  })

  it('sends the same body gzip-compressed to a client that accepts it, with Vary and the same ETag', async () => {
    const plain = await request(app)
      .get(`/api/scenarios/${winter.scenarioId}/results`)
      .set('Cookie', owner.cookie)
      .set('Accept-Encoding', 'identity')
    expect(plain.status).toBe(200)
    expect(plain.headers['content-encoding']).toBeUndefined()
    const gz = await request(app)
      .get(`/api/scenarios/${winter.scenarioId}/results`)
      .set('Cookie', owner.cookie)
      .set('Accept-Encoding', 'gzip, deflate, br')
    expect(gz.status).toBe(200)
    expect(gz.headers['content-encoding']).toBe('gzip')
    expect(gz.headers.vary).toMatch(/Accept-Encoding/i)
    expect(gz.headers.etag).toBe(plain.headers.etag)
    // supertest inflates the body: it is the same answer.
    expect(gz.body).toEqual(plain.body)
    expect(Number(gz.headers['content-length'])).toBeLessThan(
      Buffer.byteLength(JSON.stringify(plain.body)) / 2,
    )
    const revalidated = await request(app)
      .get(`/api/scenarios/${winter.scenarioId}/results`)
      .set('Cookie', owner.cookie)
      .set('If-None-Match', String(gz.headers.etag))
    expect(revalidated.status).toBe(304)
  })

  it("runs each scenario with its own vehicle's equipment and usage, whatever else is stored", async () => {
    // Two vehicles of one owner with different packs, arrays and usage: each plan (and so each result) must be
    // built from its own rows only (the plan is read by one query with correlated subqueries).
    const s = sender(owner)
    const small = examplePlan('winter-week-lofoten')
    const big = examplePlan('winter-week-lofoten')
    big.battery = { ...big.battery, cellsParallel: 3 }
    big.appliances = big.appliances.slice(0, 1)
    const a = await storePlan(s, small, { vehicle: `Small pack ${uniq()}`, scenario: 'Week A' })
    const b = await storePlan(s, big, { vehicle: `Big pack ${uniq()}`, scenario: 'Week B' })
    const [planA, planB, resA, resB] = await Promise.all([
      s('GET', `/api/scenarios/${a.scenarioId}/plan`),
      s('GET', `/api/scenarios/${b.scenarioId}/plan`),
      s('GET', `/api/scenarios/${a.scenarioId}/results`),
      s('GET', `/api/scenarios/${b.scenarioId}/results`),
    ])
    expect(planA.body.battery.cellsParallel).toBe(1)
    expect(planB.body.battery.cellsParallel).toBe(3)
    expect(planA.body.appliances).toHaveLength(small.appliances.length)
    expect(planB.body.appliances).toHaveLength(1)
    expect(resA.body.results.plan.battery.cellsParallel).toBe(1)
    expect(resB.body.results.plan.battery.cellsParallel).toBe(3)
    expect(resB.body.results.autonomy).not.toEqual(resA.body.results.autonomy)
    expect(resB.body.results.plan.appliances).toHaveLength(1)
    expect(resA.body.results.plan.name).toContain('Week A')
    expect(resB.body.results.plan.name).toContain('Week B')
  })
  it('keys its memo by a revision that every kind of edit to the plan’s rows changes, and nothing else', async () => {
    // The revision hashes the xmin of each row the plan is made of (server/modules/scenarios/plan.ts): each
    // edit below, made straight in the database as any writer would, must give a new one, and the results
    // must follow the edit.
    const s = sender(owner)
    const w = await storePlan(s, examplePlan('winter-week-lofoten'), {
      vehicle: `Rev ${uniq()}`,
      scenario: 'Rev',
    })
    const revision = async () => (await loadPlanDigestForReader(ctx.db, owner.id, w.scenarioId)).digest
    const seen = new Set<string>([await revision()])
    expect(await revision()).toBe([...seen][0]) // the same rows: the same revision
    const q = (text: string, values: unknown[]) => ctx.pool.query(text, values)
    const one = async (table: string) =>
      (await q(`SELECT id FROM ${table} WHERE vehicle_id = $1 ORDER BY seq LIMIT 1`, [w.vehicleId])).rows[0]!
        .id
    const edits: [string, () => Promise<unknown>][] = [
      ['the scenario', () => q(`UPDATE scenarios SET name = name || '.' WHERE id = $1`, [w.scenarioId])],
      ['the vehicle', () => q(`UPDATE vehicles SET name = name || '.' WHERE id = $1`, [w.vehicleId])],
      [
        'the battery bank',
        () =>
          q(
            `UPDATE battery_banks SET params = jsonb_set(params, '{cellsParallel}', '2') WHERE vehicle_id = $1`,
            [w.vehicleId],
          ),
      ],
      [
        'an appliance',
        async () => q(`UPDATE appliances SET params = params WHERE id = $1`, [await one('appliances')]),
      ],
      [
        'a charge source',
        async () =>
          q(`UPDATE charge_sources SET params = params WHERE id = $1`, [await one('charge_sources')]),
      ],
      [
        'a removed charge source',
        async () => q(`DELETE FROM charge_sources WHERE id = $1`, [await one('charge_sources')]),
      ],
      [
        'a removed appliance',
        async () => q(`DELETE FROM appliances WHERE id = $1`, [await one('appliances')]),
      ],
    ]
    for (const [what, edit] of edits) {
      await edit()
      const now = await revision()
      expect(seen.has(now), `after an edit of ${what}`).toBe(false)
      seen.add(now)
    }
    const res = await s('GET', `/api/scenarios/${w.scenarioId}/results`)
    expect(res.status).toBe(200)
    expect(res.body.results.plan.battery.cellsParallel).toBe(2)
    expect(res.body.results.plan.name).toContain('Rev.')
  })
})
