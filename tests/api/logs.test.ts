import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { readFileSync, existsSync } from 'node:fs'
import request from 'supertest'
import { eq, sql } from 'drizzle-orm'
import type { Express } from 'express'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import { logUploads, vehicleMemberships } from '../../server/db/schema/index'
import { pendingFile } from '../../server/modules/logs/pending'
import type { LogMapping } from '../../shared/logs/types'
import type { LogPreview } from '../../shared/logs/api'
import { createLofotenVan, SAMPLE_LOG } from './logs.fixture'

const ctx = testContext()
const app: Express = createApp(ctx)
let owner: TestUser
let stranger: TestUser
let viewer: TestUser
let vehicleId: string
let scenarioId: string
const sample = readFileSync(SAMPLE_LOG)

const HEADER =
  'Time,Pack voltage (V),Current (A),SOC (%),Temp (°C),Cell 1 (mV),Cell 2 (mV),Cell 3 (mV),Cell 4 (mV)'
const T0 = Date.UTC(2027, 1, 8)
/** A good line for minute `k` (one sample a minute). */
function line(k: number, o: { time?: string; v?: string; i?: string; soc?: string } = {}): string {
  const time = o.time ?? new Date(T0 + k * 60_000).toISOString().slice(0, 19).replace('T', ' ')
  return [
    time,
    o.v ?? '13.250',
    o.i ?? (k % 60 < 30 ? '-4.2' : '6.1'),
    o.soc ?? '75.0',
    '8.5',
    '3312',
    '3313',
    '3311',
    '3314',
  ].join(',')
}
/** 6,000 rows (more than one insert batch), with `bad` replacing row `at` (spreadsheet line = at + 2). */
function fileWith(bad: (k: number) => string | null, at = 5_500, rows = 6_000, header = HEADER): string {
  const out = [header]
  for (let k = 0; k < rows; k++) {
    const b = k === at ? bad(k) : null
    out.push(b ?? line(k))
  }
  return out.join('\n') + '\n'
}

async function preview(body: Buffer | string, filename = 'log.csv', user = owner, contentType = 'text/csv') {
  return request(app)
    .post(`/api/vehicles/${vehicleId}/logs/preview`)
    .set('Cookie', user.cookie)
    .attach('file', Buffer.from(body), { filename, contentType })
}

async function uploadsOfVehicle(): Promise<number> {
  return (await ctx.db.select().from(logUploads).where(eq(logUploads.vehicleId, vehicleId))).length
}
async function sampleRows(): Promise<number> {
  const r = await ctx.db.execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM log_samples`)
  return r.rows[0]!.n
}

let goodMapping: LogMapping

beforeAll(async () => {
  owner = await createUser(ctx)
  stranger = await createUser(ctx)
  viewer = await createUser(ctx)
  ;({ vehicleId, scenarioId } = await createLofotenVan(ctx, owner))
  await ctx.db.insert(vehicleMemberships).values({ vehicleId, userId: viewer.id, role: 'viewer' })
  const res = await preview(fileWith(() => null, -1, 10))
  goodMapping = (res.body as LogPreview).proposal.mapping as LogMapping
})
afterAll(() => ctx.pool.end())

describe('POST /api/vehicles/:vehicleId/logs/preview', () => {
  it('requires a session (401), membership (404) and a writing role (403)', async () => {
    await request(app).post(`/api/vehicles/${vehicleId}/logs/preview`).expect(401)
    expect((await preview('a,b\n1,2', 'x.csv', stranger)).status).toBe(404)
    expect((await preview('a,b\n1,2', 'x.csv', viewer)).status).toBe(403)
  })

  it('refuses a file that is not CSV by its name (415) or by its content (400)', async () => {
    const xlsx = await preview(
      'PK\u0003\u0004',
      'log.xlsx',
      owner,
      'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    )
    expect(xlsx.status).toBe(415)
    expect(xlsx.body.error.code).toBe('not_csv')
    const binary = await preview(Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x41]), 'log.csv')
    expect(binary.status).toBe(400)
    expect(binary.body.error.code).toBe('not_text')
    const empty = await preview('', 'log.csv')
    expect(empty.body.error.code).toBe('empty_file')
  })

  it('detects the sample log, proposes its mapping and checks every row', async () => {
    const res = await preview(sample, 'lingon.csv')
    expect(res.status).toBe(200)
    const p = res.body as LogPreview
    expect(p.detected).toEqual({ delimiter: ',', hasHeader: true, decimalSeparator: '.' })
    expect(p.proposal.missing).toEqual([])
    expect(p.proposal.mapping).toMatchObject({
      timestampColumn: 'Time',
      timestampFormat: 'ymd',
      packVoltageColumn: 'Pack voltage (V)',
      currentColumn: 'Current (A)',
      currentSign: 'charge-positive',
      socColumn: 'SOC (%)',
      socUnit: 'percent',
      cellVoltageUnit: 'mV',
    })
    expect(p.proposal.mapping.cellVoltageColumns).toHaveLength(4)
    expect(p.rows[0]!.row).toBe(2)
    expect(p.check).toMatchObject({ rowCount: 20_160, errorCount: 0 })
    expect(await uploadsOfVehicle()).toBe(0) // nothing stored by a preview
  })
})

describe('POST /api/vehicles/:vehicleId/logs/:uploadId/import', () => {
  let uploadId: string

  it('imports the sample log in one go, with daily summaries, and remembers the mapping', async () => {
    const p = (await preview(sample, 'lingon.csv')).body as LogPreview
    const mapping = { ...(p.proposal.mapping as LogMapping), utcOffsetMinutes: 60 }
    const before = await sampleRows()
    const res = await request(app)
      .post(`/api/vehicles/${vehicleId}/logs/${p.uploadId}/import`)
      .set('Cookie', owner.cookie)
      .send({ mapping })
    expect(res.status).toBe(201)
    uploadId = res.body.id
    expect(res.body).toMatchObject({ rowCount: 20_160, dayCount: 14, fileName: 'lingon.csv' })
    expect(res.body.firstTs).toBe('2027-02-07T23:00:00.000Z')
    expect(res.body.spreadTrend.status).toBe('drifting')
    expect((await sampleRows()) - before).toBe(20_160)
    expect(existsSync(pendingFile(p.uploadId))).toBe(false)

    const again = (await preview(sample, 'lingon.csv')).body as LogPreview
    expect(again.proposal.source).toBe('remembered')
    expect(again.proposal.mapping.utcOffsetMinutes).toBe(60)
  })

  it('lists uploads and daily summaries to members only', async () => {
    const list = await request(app)
      .get(`/api/vehicles/${vehicleId}/logs`)
      .set('Cookie', viewer.cookie)
      .expect(200)
    expect(list.body.items.map((u: { id: string }) => u.id)).toContain(uploadId)
    await request(app).get(`/api/logs/${uploadId}/days`).set('Cookie', stranger.cookie).expect(404)
    const days = await request(app).get(`/api/logs/${uploadId}/days`).set('Cookie', viewer.cookie).expect(200)
    expect(days.body.days).toHaveLength(14)
    const d = days.body.days[1]
    expect(d.date).toBe('2027-02-09')
    expect(d.sampleCount).toBe(1440)
    expect(d.energyOutWh).toBeGreaterThan(d.energyInWh)
    expect(d.cellSpreadTypicalMv).toBeGreaterThan(0)
  })

  it('compares with the scenario and makes a calibrated copy with one call', async () => {
    const cmp = await request(app)
      .get(`/api/logs/${uploadId}/compare?scenarioId=${scenarioId}`)
      .set('Cookie', viewer.cookie)
      .expect(200)
    expect(cmp.body.alignment).toBe('date')
    expect(cmp.body.totals.days).toBe(7)
    expect(cmp.body.useRatio).toBeGreaterThan(1.15)
    expect(cmp.body.suggestion.message).toMatch(/^Measured use is \d+ % above plan/)

    await request(app)
      .post(`/api/logs/${uploadId}/calibrate`)
      .set('Cookie', viewer.cookie)
      .send({ scenarioId })
      .expect(403)
    const cal = await request(app)
      .post(`/api/logs/${uploadId}/calibrate`)
      .set('Cookie', owner.cookie)
      .send({ scenarioId })
      .expect(201)
    expect(cal.body.scenario.name).toMatch(/calibrated ×1\.\d\d/)
    const copy = await request(app)
      .get(`/api/scenarios/${cal.body.scenario.id}`)
      .set('Cookie', owner.cookie)
      .expect(200)
    const usages = Object.values(copy.body.usage) as { hoursPerDay?: number }[]
    expect(usages.length).toBeGreaterThan(0)
    // The calibrated copy plans more use: its comparison ratio comes closer to 1.
    const cmp2 = await request(app)
      .get(`/api/logs/${uploadId}/compare?scenarioId=${cal.body.scenario.id}`)
      .set('Cookie', owner.cookie)
      .expect(200)
    expect(Math.abs(cmp2.body.useRatio - 1)).toBeLessThan(Math.abs(cmp.body.useRatio - 1))
    console.log(
      `[logs] use ratio before calibration ${cmp.body.useRatio.toFixed(3)}, after ${cmp2.body.useRatio.toFixed(3)}`,
    )
  })

  it('answers an unknown or someone else’s upload with 404', async () => {
    const res = await request(app)
      .post(`/api/vehicles/${vehicleId}/logs/00000000-0000-4000-8000-000000000000/import`)
      .set('Cookie', owner.cookie)
      .send({ mapping: goodMapping })
    expect(res.status).toBe(404)
  })

  const cases: [string, string, (m: LogMapping) => LogMapping, () => string, number, string | null][] = [
    [
      'wrong delimiter',
      'wrong_delimiter',
      (m) => m,
      () => fileWith(() => null).replaceAll(',', ';'),
      1,
      null,
    ],
    [
      'missing column',
      'missing_column',
      (m) => m,
      () => fileWith(() => null, -1, 6_000, HEADER.replace('Current (A)', 'Amps')),
      1,
      'Current (A)',
    ],
    [
      'text in a number field',
      'not_a_number',
      (m) => m,
      () => fileWith((k) => line(k, { i: 'err' })),
      5_502,
      'Current (A)',
    ],
    [
      'timestamps out of order',
      'timestamp_out_of_order',
      (m) => m,
      () => fileWith((k) => line(k - 10)),
      5_502,
      'Time',
    ],
    [
      'duplicated timestamp',
      'timestamp_duplicate',
      (m) => m,
      () => fileWith((k) => line(k - 1)),
      5_502,
      'Time',
    ],
    [
      'a gap',
      'gap',
      (m) => ({ ...m, maxGapMinutes: 30 }),
      () => fileWith(() => null, -1) + line(9_000) + '\n',
      6_002,
      'Time',
    ],
    [
      'an impossible value',
      'impossible_value',
      (m) => m,
      () => fileWith((k) => line(k, { soc: '180' })),
      5_502,
      'SOC (%)',
    ],
  ]
  for (const [name, code, mapFn, build, row, column] of cases) {
    it(`refuses ${name} with its specific error and stores nothing`, async () => {
      const before = { uploads: await uploadsOfVehicle(), samples: await sampleRows() }
      const p = (await preview(build(), `${code}.csv`)).body as LogPreview
      expect(p.uploadId).toBeTruthy()
      const res = await request(app)
        .post(`/api/vehicles/${vehicleId}/logs/${p.uploadId}/import`)
        .set('Cookie', owner.cookie)
        .send({ mapping: mapFn(goodMapping) })
      expect(res.status).toBe(400)
      expect(res.body.error.code).toBe('import_invalid')
      expect(res.body.error.errors[0]).toMatchObject({ code, row, column })
      expect(res.body.error.errorCount).toBe(1)
      expect(await uploadsOfVehicle()).toBe(before.uploads)
      expect(await sampleRows()).toBe(before.samples)
    })
  }

  it('checks a corrected mapping without storing anything', async () => {
    const p = (await preview(fileWith(() => null).replaceAll(',', ';'), 'semi.csv')).body as LogPreview
    const wrong = await request(app)
      .post(`/api/vehicles/${vehicleId}/logs/${p.uploadId}/check`)
      .set('Cookie', owner.cookie)
      .send({ mapping: goodMapping })
      .expect(200)
    expect(wrong.body.errors[0].code).toBe('wrong_delimiter')
    const right = await request(app)
      .post(`/api/vehicles/${vehicleId}/logs/${p.uploadId}/check`)
      .set('Cookie', owner.cookie)
      .send({ mapping: { ...goodMapping, format: { ...goodMapping.format, delimiter: ';' } } })
      .expect(200)
    expect(right.body).toMatchObject({ rowCount: 6_000, errorCount: 0 })
  })

  it('names mapping fields it cannot accept (400 validation_failed)', async () => {
    const p = (
      await preview(
        fileWith(() => null, -1, 5),
        'small.csv',
      )
    ).body as LogPreview
    const res = await request(app)
      .post(`/api/vehicles/${vehicleId}/logs/${p.uploadId}/import`)
      .set('Cookie', owner.cookie)
      .send({ mapping: { ...goodMapping, currentSign: 'sideways' } })
      .expect(400)
    expect(Object.keys(res.body.error.fields)).toContain('mapping.currentSign')
  })
})
