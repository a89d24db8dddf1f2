import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { createApp } from '../../server/app'
import type { AppContext } from '../../server/context'
import {
  appliances,
  batteryBanks,
  chargeSources,
  inverters,
  scenarios,
  vehicleMemberships,
  vehicles,
} from '../../server/db/schema/index'
import { testContext, uniq } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import { testVan } from '../../shared/buildsheet/testPlans'

const ctx = testContext()
const app = createApp(ctx)
afterAll(() => ctx.pool.end())

/** A vehicle with the test van's equipment and one scenario, straight into the tables. */
async function vanFor(c: AppContext, owner: TestUser, others: [TestUser, 'editor' | 'viewer'][] = []) {
  const plan = testVan('lfp')
  const [v] = await c.db
    .insert(vehicles)
    .values({
      name: `Van ${uniq()}`,
      kind: 'van',
      systemVoltageV: 12,
      createdBy: owner.id,
      updatedBy: owner.id,
    })
    .returning()
  const vehicleId = v!.id
  await c.db
    .insert(vehicleMemberships)
    .values([
      { vehicleId, userId: owner.id, role: 'owner' },
      ...others.map(([u, role]) => ({ vehicleId, userId: u.id, role })),
    ])
  await c.db.insert(batteryBanks).values({ vehicleId, params: plan.battery })
  await c.db.insert(inverters).values({ vehicleId, params: plan.inverter ?? null })
  for (const a of plan.appliances) {
    const { id: _id, usage: _u, ...params } = a
    await c.db.insert(appliances).values({ vehicleId, params })
  }
  for (const s of plan.sources) {
    const { id: _id, ...params } = s
    await c.db.insert(chargeSources).values({ vehicleId, kind: s.kind, params })
  }
  const [sc] = await c.db
    .insert(scenarios)
    .values({ vehicleId, name: 'Winter test', trip: plan.trip })
    .returning()
  return { vehicleId, scenarioId: sc!.id }
}

let owner: TestUser
let viewer: TestUser
let stranger: TestUser
let vehicleId: string
let scenarioId: string

beforeAll(async () => {
  owner = await createUser(ctx)
  viewer = await createUser(ctx)
  stranger = await createUser(ctx)
  ;({ vehicleId, scenarioId } = await vanFor(ctx, owner, [[viewer, 'viewer']]))
})

describe('GET /api/vehicles/:vehicleId/build-sheet', () => {
  it('requires a session (401)', async () => {
    await request(app).get(`/api/vehicles/${vehicleId}/build-sheet`).expect(401)
  })

  it("hides other people's vehicles (404)", async () => {
    const res = await request(app)
      .get(`/api/vehicles/${vehicleId}/build-sheet`)
      .set('cookie', stranger.cookie)
      .expect(404)
    expect(res.body.error.code).toBe('not_found')
  })

  it('computes the sheet from the first scenario, with default settings (version 0)', async () => {
    const res = await request(app)
      .get(`/api/vehicles/${vehicleId}/build-sheet`)
      .set('cookie', viewer.cookie)
      .expect(200)
    expect(res.body.scenarioId).toBe(scenarioId)
    expect(res.body.missing).toEqual([])
    expect(res.body.settings.version).toBe(0)
    expect(res.body.sheet.ratings.totalChargeA).toBe(60)
    expect(res.body.sheet.protection.rules.map((r: { id: string }) => r.id)).toContain('charge-too-cold')
    expect(res.body.sheet.diagram.nodes.filter((n: { kind: string }) => n.kind === 'source')).toHaveLength(2)
    expect(res.body.sheet.cautions.map((c: { id: string }) => c.id)).toEqual(
      expect.arrayContaining(['fire', 'lithium']),
    )
  })

  it('says what is missing when the vehicle has no scenario', async () => {
    const [v] = await ctx.db
      .insert(vehicles)
      .values({ name: 'Empty', kind: 'van', systemVoltageV: 12 })
      .returning()
    await ctx.db.insert(vehicleMemberships).values({ vehicleId: v!.id, userId: owner.id, role: 'owner' })
    const res = await request(app)
      .get(`/api/vehicles/${v!.id}/build-sheet`)
      .set('cookie', owner.cookie)
      .expect(200)
    expect(res.body.sheet).toBeNull()
    expect(res.body.missing[0]).toMatch(/Add a scenario/)
  })

  it('rejects a scenario of another vehicle and names the field (400)', async () => {
    const other = await vanFor(ctx, stranger)
    const res = await request(app)
      .get(`/api/vehicles/${vehicleId}/build-sheet?scenarioId=${other.scenarioId}`)
      .set('cookie', owner.cookie)
      .expect(400)
    expect(res.body.error.fields.scenarioId).toBeDefined()
  })
})

describe('PUT /api/vehicles/:vehicleId/build-sheet/settings', () => {
  it('refuses viewers (403)', async () => {
    await request(app)
      .put(`/api/vehicles/${vehicleId}/build-sheet/settings`)
      .set('cookie', viewer.cookie)
      .send({ version: 0, checklist: { 'rule:charge-too-cold': true } })
      .expect(403)
  })

  it('names a bad field and saves nothing (400)', async () => {
    const res = await request(app)
      .put(`/api/vehicles/${vehicleId}/build-sheet/settings`)
      .set('cookie', owner.cookie)
      .send({ version: 0, cableRuns: { main: { oneWayLengthM: -1 } } })
      .expect(400)
    expect(res.body.error.fields['cableRuns.main.oneWayLengthM']).toEqual(['must be greater than 0'])
    const after = await request(app).get(`/api/vehicles/${vehicleId}/build-sheet`).set('cookie', owner.cookie)
    expect(after.body.settings.version).toBe(0)
  })

  it('refuses protection thresholds that contradict each other, naming the threshold', async () => {
    const res = await request(app)
      .put(`/api/vehicles/${vehicleId}/build-sheet/settings`)
      .set('cookie', owner.cookie)
      .send({ version: 0, protection: { heaterOnBelowC: 10, heaterOffAboveC: 5 } })
      .expect(400)
    expect(res.body.error.fields['protection.heaterOffAboveC'][0]).toMatch(/above/)
  })

  it('stores ticks, overrides and cable edits; the sheet uses them; a stale version gets 409', async () => {
    const put = await request(app)
      .put(`/api/vehicles/${vehicleId}/build-sheet/settings`)
      .set('cookie', owner.cookie)
      .send({
        version: 0,
        checklist: { 'rule:charge-too-cold': true },
        protection: { heaterOnBelowC: 4, heaterOffAboveC: 8 },
        cableRuns: { main: { oneWayLengthM: 2.5 } },
      })
      .expect(200)
    expect(put.body.version).toBe(1)
    expect(put.body.updatedBy.id).toBe(owner.id)

    const res = await request(app)
      .get(`/api/vehicles/${vehicleId}/build-sheet`)
      .set('cookie', viewer.cookie)
      .expect(200)
    expect(res.body.settings.checklist).toEqual({ 'rule:charge-too-cold': true })
    const heaterOn = res.body.sheet.protection.rules.find((r: { id: string }) => r.id === 'heater-on')
    expect(heaterOn.condition).toBe('Pack colder than 4 °C')
    expect(res.body.sheet.cableRuns.find((c: { id: string }) => c.id === 'main').oneWayLengthM).toBe(2.5)

    const stale = await request(app)
      .put(`/api/vehicles/${vehicleId}/build-sheet/settings`)
      .set('cookie', owner.cookie)
      .send({ version: 0, checklist: {} })
      .expect(409)
    expect(stale.body.error.code).toBe('conflict')
  })
})

describe('parts: /api/vehicles/:vehicleId/parts', () => {
  it('creates, lists, patches and deletes with exact decimal money; 409 on a stale version', async () => {
    const base = `/api/vehicles/${vehicleId}/parts`
    await request(app).post(base).set('cookie', viewer.cookie).send({}).expect(403)
    const bad = await request(app)
      .post(base)
      .set('cookie', owner.cookie)
      .send({ name: 'Fuse', quantity: '1', unitPrice: 0.1, currency: 'EUR', massKg: null })
      .expect(400)
    expect(bad.body.error.fields.unitPrice[0]).toMatch(/written as text/)

    const ids: string[] = []
    for (let i = 0; i < 10; i++) {
      for (const price of ['0.10', '0.20']) {
        const r = await request(app)
          .post(base)
          .set('cookie', owner.cookie)
          .send({
            name: `Ring terminal ${i}`,
            quantity: '1',
            unitPrice: price,
            currency: 'EUR',
            massKg: 0.01,
          })
          .expect(201)
        ids.push(r.body.id)
      }
    }
    const list = await request(app).get(base).set('cookie', viewer.cookie).expect(200)
    expect(list.body.items).toHaveLength(20)
    expect(list.body.items[0].unitPrice).toBe('0.10')

    const sheet = await request(app).get(`/api/vehicles/${vehicleId}/build-sheet`).set('cookie', owner.cookie)
    expect(sheet.body.sheet.parts.totals).toEqual([
      { currency: 'EUR', total: '3.00', perUsableKWh: '1.30', lineCount: 20 }, // 3.00 / 2.304 kWh
    ])
    expect(sheet.body.sheet.parts.massTotalKg).toBe(0.2)

    const first = list.body.items[0]
    const patched = await request(app)
      .patch(`${base}/${first.id}`)
      .set('cookie', owner.cookie)
      .send({ version: first.version, quantity: '2.5', unitPrice: '19.99' })
      .expect(200)
    expect(patched.body).toMatchObject({ quantity: '2.5', unitPrice: '19.99', version: 2 })

    const stale = await request(app)
      .patch(`${base}/${first.id}`)
      .set('cookie', owner.cookie)
      .send({ version: first.version, quantity: '3' })
      .expect(409)
    expect(stale.body.error.current.quantity).toBe('2.5')

    await request(app).delete(`${base}/${first.id}?version=1`).set('cookie', owner.cookie).expect(409)
    await request(app).delete(`${base}/${first.id}?version=2`).set('cookie', owner.cookie).expect(204)
    await request(app).delete(`${base}/${first.id}?version=2`).set('cookie', owner.cookie).expect(404)
    await request(app).get(base).set('cookie', stranger.cookie).expect(404)
  })
})
