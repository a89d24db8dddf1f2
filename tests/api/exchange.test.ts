/**
 * Plan files and CSV (issue 10): export → import round trip gives the identical plan and identical results
 * (only the database ids differ); older format versions are upgraded; bad files get field-named errors and
 * change nothing; a vehicle that already has equipment keeps it; hourly CSV has one row per hour.
 */
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { createApp } from '../../server/app'
import { testContext, uniq } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import { PLAN_FILE_VERSION, readPlanFile } from '../../shared/exchange/format'
import { HOURLY_CSV_COLUMNS } from '../../shared/exchange/hourly-csv'
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

/** Map each id of `b`'s plan to the id at the same place in `a`'s, so two JSON texts compare exactly. */
function sameIds(
  text: string,
  from: { appliances: { id: string }[]; sources: { id: string }[] },
  to: typeof from,
): string {
  let out = text
  from.appliances.forEach((x, i) => (out = out.split(x.id).join(to.appliances[i]!.id)))
  from.sources.forEach((x, i) => (out = out.split(x.id).join(to.sources[i]!.id)))
  return out
}

async function countScenarios(user: TestUser, vehicleId: string): Promise<number> {
  const res = await request(app).get(`/api/vehicles/${vehicleId}/scenarios`).set('Cookie', user.cookie)
  return res.body.total
}

describe('plan files', () => {
  let alice: TestUser
  let bob: TestUser
  let source: { vehicleId: string; scenarioId: string }
  const names = { vehicle: `Lingon ${uniq()}`, scenario: 'Winter week' }

  beforeAll(async () => {
    alice = await createUser(ctx)
    bob = await createUser(ctx)
    source = await storePlan(sender(alice), examplePlan('winter-week-lofoten'), names)
  })

  it('exports a versioned plan file as a download; strangers get 404', async () => {
    const res = await request(app)
      .get(`/api/scenarios/${source.scenarioId}/export.json`)
      .set('Cookie', alice.cookie)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toContain('application/json')
    expect(res.headers['content-disposition']).toContain(`${names.vehicle} - Winter week.ohmward.json`)
    expect(res.body.format).toBe('ohmward-plan')
    expect(res.body.formatVersion).toBe(PLAN_FILE_VERSION)
    expect(Number.isNaN(Date.parse(res.body.exportedAt))).toBe(false)
    expect(res.body.vehicle).toEqual({ name: names.vehicle, kind: 'van', systemVoltageV: 12 })
    expect(res.body.scenario.name).toBe('Winter week')
    const plan = await request(app)
      .get(`/api/scenarios/${source.scenarioId}/plan`)
      .set('Cookie', alice.cookie)
    expect(res.body.plan).toEqual(plan.body)
    const stranger = await request(app)
      .get(`/api/scenarios/${source.scenarioId}/export.json`)
      .set('Cookie', bob.cookie)
    expect(stranger.status).toBe(404)
  })

  it('round trip: another account imports the file into a new vehicle and gets the identical plan and results', async () => {
    const file = (
      await request(app).get(`/api/scenarios/${source.scenarioId}/export.json`).set('Cookie', alice.cookie)
    ).body
    const v = await request(app)
      .post('/api/vehicles')
      .set('Cookie', bob.cookie)
      .send({ name: names.vehicle, kind: 'van', systemVoltageV: 12 })
    const imp = await request(app)
      .post(`/api/vehicles/${v.body.id}/scenarios/import`)
      .set('Cookie', bob.cookie)
      .send(file)
    expect(imp.status).toBe(201)
    expect(imp.body.equipmentCreated).toBe(true)
    expect(imp.body.upgradedFrom).toBeNull()
    expect(imp.body.scenario.name).toBe('Winter week')
    expect(imp.body.scenario.vehicleId).toBe(v.body.id)

    const get = (user: TestUser, id: string, what: 'plan' | 'results') =>
      request(app).get(`/api/scenarios/${id}/${what}`).set('Cookie', user.cookie)
    const [planA, planB] = [
      (await get(alice, source.scenarioId, 'plan')).body,
      (await get(bob, imp.body.scenario.id, 'plan')).body,
    ]
    expect(planB.appliances).toHaveLength(planA.appliances.length)
    expect(planB.appliances[0].id).not.toBe(planA.appliances[0].id) // new records in the new vehicle
    expect(sameIds(JSON.stringify(planB), planB, planA)).toBe(JSON.stringify(planA))

    const [resA, resB] = [
      (await get(alice, source.scenarioId, 'results')).body.results,
      (await get(bob, imp.body.scenario.id, 'results')).body.results,
    ]
    expect(sameIds(JSON.stringify(resB), planB, planA)).toBe(JSON.stringify(resA))

    // And exporting again gives the same file, apart from the export time.
    const again = (
      await request(app).get(`/api/scenarios/${imp.body.scenario.id}/export.json`).set('Cookie', bob.cookie)
    ).body
    expect(sameIds(JSON.stringify({ ...again, exportedAt: '' }), planB, planA)).toBe(
      JSON.stringify({ ...file, exportedAt: '' }),
    )
  })

  it('upgrades a version 1 file (a bare plan document) and imports it', async () => {
    const v = await request(app)
      .post('/api/vehicles')
      .set('Cookie', bob.cookie)
      .send({ name: `Cabin ${uniq()}`, kind: 'cabin', systemVoltageV: 48 })
    const bare = examplePlan('cabin-autumn-overcast')
    const imp = await request(app)
      .post(`/api/vehicles/${v.body.id}/scenarios/import?name=${encodeURIComponent('Autumn at the cabin')}`)
      .set('Cookie', bob.cookie)
      .send(bare)
    expect(imp.status).toBe(201)
    expect(imp.body.upgradedFrom).toBe(1)
    expect(imp.body.scenario.name).toBe('Autumn at the cabin')
    expect(imp.body.notes.join(' ')).toContain('format version 1')
    const plan = (
      await request(app).get(`/api/scenarios/${imp.body.scenario.id}/plan`).set('Cookie', bob.cookie)
    ).body
    expect(plan.trip).toEqual(bare.trip)
    expect(plan.appliances.map((a: { name: string }) => a.name)).toEqual(bare.appliances.map((a) => a.name))
    expect(plan.battery).toEqual(bare.battery)
  })

  it('the upgrade chain is pure and ends at the current version', () => {
    const bare = examplePlan('summer-month-andalusia')
    const before = JSON.stringify(bare)
    const read = readPlanFile(bare)
    expect(JSON.stringify(bare)).toBe(before)
    expect(read.ok).toBe(true)
    if (!read.ok) return
    expect(read.file.formatVersion).toBe(PLAN_FILE_VERSION)
    expect(read.upgradedFrom).toBe(1)
    expect(read.file.vehicle.systemVoltageV).toBe(24) // AGM 24 V bank in that example
  })

  it('refuses bad files with field-named errors and saves nothing', async () => {
    const v = await request(app)
      .post('/api/vehicles')
      .set('Cookie', bob.cookie)
      .send({ name: `Empty ${uniq()}`, kind: 'van', systemVoltageV: 12 })
    const url = `/api/vehicles/${v.body.id}/scenarios/import`
    const good = (
      await request(app).get(`/api/scenarios/${source.scenarioId}/export.json`).set('Cookie', alice.cookie)
    ).body
    const post = (body: unknown) =>
      request(app)
        .post(url)
        .set('Cookie', bob.cookie)
        .send(body as object)

    const notOurs = await post({ hello: 'world' })
    expect(notOurs.status).toBe(400)
    expect(notOurs.body.error.code).toBe('import_invalid')
    expect(notOurs.body.error.message).toMatch(/not an Ohmward plan file/)

    const newer = await post({ ...good, formatVersion: 99 })
    expect(newer.status).toBe(400)
    expect(newer.body.error.message).toMatch(/newer Ohmward/)

    const broken = structuredClone(good)
    broken.plan.battery.capacityAh = -5
    broken.plan.trip.days = 0
    broken.vehicle.kind = 'spaceship'
    broken.plan.appliances[0].powerWatts = 12
    const bad = await post(broken)
    expect(bad.status).toBe(400)
    expect(bad.body.error.code).toBe('import_invalid')
    const fields = Object.keys(bad.body.error.fields)
    expect(fields).toEqual(
      expect.arrayContaining([
        'plan.battery.capacityAh',
        'plan.trip.days',
        'vehicle.kind',
        'plan.appliances.0.powerWatts',
      ]),
    )
    expect(bad.body.error.fields['plan.appliances.0.powerWatts']).toEqual(['is not a known field'])

    const notJson = await request(app)
      .post(url)
      .set('Cookie', bob.cookie)
      .set('Content-Type', 'application/json')
      .send('{"format": "ohmward-plan", ')
    expect(notJson.status).toBe(400)

    // A row the vehicle's appliance list would refuse (10 h a day in a 4 h window), although the file's
    // per-scenario usage (2 h) fits: the import checks each row as the appliance endpoint does.
    const squeezed = structuredClone(good)
    Object.assign(squeezed.plan.appliances[0], {
      hoursPerDay: 10,
      startHour: 8,
      endHour: 12,
      usage: { hoursPerDay: 2 },
    })
    delete squeezed.plan.appliances[0].dutyCycleFraction
    const rows = await post(squeezed)
    expect(rows.status).toBe(400)
    expect(rows.body.error.code).toBe('import_invalid')
    expect(Object.keys(rows.body.error.fields)).toEqual(['plan.appliances.0.hoursPerDay'])

    expect(await countScenarios(bob, v.body.id)).toBe(0)
    const battery = await request(app).get(`/api/vehicles/${v.body.id}/battery`).set('Cookie', bob.cookie)
    expect(battery.body.battery).toBeNull()
    const appliances = await request(app)
      .get(`/api/vehicles/${v.body.id}/appliances`)
      .set('Cookie', bob.cookie)
    expect(appliances.body.items).toHaveLength(0)
  })

  it('keeps a vehicle’s own equipment and carries usage over by appliance name', async () => {
    const file = (
      await request(app).get(`/api/scenarios/${source.scenarioId}/export.json`).set('Cookie', alice.cookie)
    ).body
    const other = await storePlan(sender(bob), examplePlan('winter-week-lofoten'), {
      vehicle: `Own ${uniq()}`,
      scenario: 'Mine',
    })
    // Change the trip in the file and give one usage override to a name the vehicle has, one to a name it has not.
    file.plan.trip.nightLowC = -21
    file.plan.appliances[0].usage = { hoursPerDay: 20 }
    file.plan.appliances[1].name = 'Something else entirely'
    file.plan.appliances[1].usage = { enabled: false }
    const before = (
      await request(app).get(`/api/vehicles/${other.vehicleId}/appliances`).set('Cookie', bob.cookie)
    ).body
    const imp = await request(app)
      .post(`/api/vehicles/${other.vehicleId}/scenarios/import`)
      .set('Cookie', bob.cookie)
      .send(file)
    expect(imp.body.error ?? null).toBeNull()
    expect(imp.status).toBe(201)
    expect(imp.body.equipmentCreated).toBe(false)
    expect(imp.body.notes.join(' ')).toContain('“Something else entirely”')
    const after = (
      await request(app).get(`/api/vehicles/${other.vehicleId}/appliances`).set('Cookie', bob.cookie)
    ).body
    expect(after).toEqual(before)
    expect(imp.body.scenario.trip.nightLowC).toBe(-21)
    const firstId = before.items[0].id
    expect(imp.body.scenario.usage[firstId]).toEqual({ hoursPerDay: 20 })
    expect(Object.keys(imp.body.scenario.usage)).toHaveLength(
      Object.values(file.plan.appliances as { name: string; usage?: unknown }[]).filter(
        (a) => a.usage && before.items.some((b: { name: string }) => b.name === a.name),
      ).length,
    )
  })

  it('refuses an import from someone who cannot write to the vehicle', async () => {
    const file = (
      await request(app).get(`/api/scenarios/${source.scenarioId}/export.json`).set('Cookie', alice.cookie)
    ).body
    const res = await request(app)
      .post(`/api/vehicles/${source.vehicleId}/scenarios/import`)
      .set('Cookie', bob.cookie)
      .send(file)
    expect(res.status).toBe(404)
  })
})

describe('GET /api/scenarios/:scenarioId/hourly.csv', () => {
  it('has one row per simulated hour with the results’ values', async () => {
    const user = await createUser(ctx)
    const s = await storePlan(sender(user), examplePlan('winter-week-lofoten'), {
      vehicle: `Csv ${uniq()}`,
      scenario: 'Hours',
    })
    const res = await request(app).get(`/api/scenarios/${s.scenarioId}/hourly.csv`).set('Cookie', user.cookie)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toContain('text/csv')
    expect(res.headers['content-disposition']).toContain('Hours - hourly.csv')
    const parsed = Papa.parse<Record<string, string>>(res.text.trim(), { header: true })
    expect(parsed.errors).toEqual([])
    expect(parsed.meta.fields).toEqual([...HOURLY_CSV_COLUMNS])
    const results = (
      await request(app).get(`/api/scenarios/${s.scenarioId}/results`).set('Cookie', user.cookie)
    ).body.results
    expect(parsed.data).toHaveLength(results.hours)
    expect(parsed.data[0]!.date).toBe(results.days[0].date)
    const h = 30
    expect(Number(parsed.data[h]!.socEndFraction)).toBeCloseTo(results.series.socEndFraction[h], 5)
    expect(Number(parsed.data[h]!.source_solar_W)).toBeCloseTo(results.series.sourceW.solar[h], 2)
    expect(Number(parsed.data[h]!.load_fridge_W)).toBeCloseTo(results.series.loadW.fridge[h], 2)
    expect(parsed.data[h]!.hourOfDay).toBe('6')
  })
})
