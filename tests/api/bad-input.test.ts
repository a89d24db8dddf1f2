/**
 * Bad input on every write route (issue 11, part 3). The route list is read from the mounted Express router,
 * so a new POST/PUT/PATCH/DELETE under /api without a case here fails the first test. Each route gets
 * fast-check-generated hostile requests (wrong types, huge strings, negative/NaN/Infinity numbers, unknown
 * fields, deep nesting, SQL and HTML fragments, NUL bytes, arrays for objects, hostile path parameters and
 * version queries) from a user with write access to real rows. Every answer must be below 500; every 4xx must
 * be `{ error: { code, message } }`; and a refused request must change nothing: a checksum of every row in
 * every table that mentions the fixture's ids (users, vehicle, scenario, review, …) is the same before and
 * after, and no mail is queued. Fixed seed, a bounded number of runs per route.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import request from 'supertest'
import fc from 'fast-check'
import { sql } from 'drizzle-orm'
import type { Router } from 'express'
import { createApp } from '../../server/app'
import { apiRouter } from '../../server/routes/index'
import { testContext } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import { advisorWithProfile, crewFixture, type CrewFixture } from '../support/sharing'
import { examplePlan } from './results.fixture'

const ctx = testContext({ APP_URL: 'http://127.0.0.1:39998' })
const app = createApp(ctx)
afterAll(() => ctx.pool.end())

const RUNS = Number(process.env.OHMWARD_FUZZ_RUNS ?? 15)
const SEED = 20261102

// ---------------------------------------------------------------- the mounted write routes

interface StackLayer {
  rawPath?: string | string[]
  route?: { path: string; methods: Record<string, boolean> }
  handle: { stack?: StackLayer[] }
}

/** Every (method, path) for POST/PUT/PATCH/DELETE in the API router, paths as written (`/vehicles/:vehicleId`). */
function writeRoutes(): string[] {
  const out = new Set<string>()
  const join = (a: string, b: string) => (a + (b === '/' ? '' : b)).replace(/\/+/g, '/') || '/'
  const walk = (stack: StackLayer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const m of Object.keys(layer.route.methods)) {
          if (['post', 'put', 'patch', 'delete'].includes(m))
            out.add(`${m.toUpperCase()} ${join(prefix, layer.route.path)}`)
        }
      } else if (layer.handle.stack) {
        const p = Array.isArray(layer.rawPath) ? layer.rawPath[0]! : (layer.rawPath ?? '/')
        walk(layer.handle.stack, join(prefix, p))
      }
    }
  }
  walk((apiRouter(ctx) as unknown as Router & { stack: StackLayer[] }).stack, '/api')
  return [...out].sort()
}

// ---------------------------------------------------------------- hostile values

const SQL = [
  "'; DROP TABLE vehicles; --",
  "1' OR '1'='1",
  '1; SELECT pg_sleep(5)',
  "admin'--",
  '" OR ""="',
  '$1',
  '%',
  '\\',
]
const HTML = [
  '<img src=x onerror=alert(1)>',
  '<script>alert(1)</script>',
  '"><svg onload=alert(1)>',
  '{{7*7}}',
]
const ODD_STRINGS = [
  '',
  ' ',
  'NaN',
  'Infinity',
  '-Infinity',
  '-1',
  '1e309',
  '0x10',
  '１２',
  'null',
  'true',
  '\u0000',
  'a\u0000b',
  '\uD800',
  '../../etc/passwd',
  '__proto__',
  'constructor',
  '\u202Egnp.exe',
  '00000000-0000-0000-0000-000000000000',
  'not-a-uuid',
]
const ODD_NUMBERS = [
  -1,
  -0,
  0,
  0.5,
  -1e308,
  1e308,
  Number.MAX_SAFE_INTEGER + 2,
  Number.MIN_SAFE_INTEGER,
  2 ** 31,
  -(2 ** 31) - 1,
  1e-320,
]

const hugeString = fc.oneof(
  fc.integer({ min: 10_000, max: 300_000 }).map((n) => 'x'.repeat(n)),
  fc.integer({ min: 1_000, max: 20_000 }).map((n) => '<b>'.repeat(n)),
)
const deep = fc.integer({ min: 50, max: 3_000 }).chain((depth) =>
  fc.constantFrom('array', 'object').map((kind) => {
    let v: unknown = 1
    for (let i = 0; i < depth; i++) v = kind === 'array' ? [v] : { a: v }
    return v
  }),
)
const scalar: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom(...SQL, ...HTML, ...ODD_STRINGS),
  fc.constantFrom(...ODD_NUMBERS),
  fc.constantFrom(null, true, false, [], {}, [null], { '': '' }),
  fc.string({ maxLength: 40 }),
  fc.double(),
  fc.integer(),
)
/** Any hostile value: scalars, JSON values, huge strings, deep nesting, prototype keys. */
const hostile: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 5, arbitrary: scalar },
  { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 4 }) },
  { weight: 1, arbitrary: hugeString },
  { weight: 1, arbitrary: deep },
  { weight: 1, arbitrary: fc.array(scalar, { maxLength: 5 }) },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      { __proto__: { admin: true } } as unknown,
      JSON.parse('{"__proto__":{"role":"admin"}}'),
      {
        constructor: { prototype: { x: 1 } },
      },
    ),
  },
)

type Mutation = (base: Record<string, unknown> | null) => unknown

/** A whole body: hostile, or the route's valid body with one field (or a nested field) made hostile. */
function bodyFor(keys: string[]): fc.Arbitrary<Mutation> {
  const whole = hostile.map(
    (v): Mutation =>
      () =>
        v,
  )
  if (!keys.length) return whole
  const key = fc.constantFrom(...keys)
  return fc.oneof(
    { weight: 2, arbitrary: whole },
    { weight: 4, arbitrary: fc.tuple(key, hostile).map(([k, v]): Mutation => (b) => ({ ...b, [k]: v })) },
    {
      weight: 1,
      arbitrary: hostile.map((v): Mutation => (b) => ({ ...b, unknownField: v, ['$where']: '1=1' })),
    },
    { weight: 1, arbitrary: fc.constant<Mutation>((b) => [b]) },
    {
      weight: 1,
      arbitrary: fc
        .tuple(key, hostile)
        .map(([k, v]): Mutation => (b) => ({ ...b, [k]: { nested: v, $gt: '' } })),
    },
  )
}

/** Path parameter values that are not ids of anything. */
const hostileParam = fc.constantFrom(
  ...SQL,
  ...HTML,
  'not-a-uuid',
  '00000000-0000-0000-0000-000000000000',
  'ffffffff-ffff-ffff-ffff-fffffffffffffff',
  'x'.repeat(5000),
  '%00',
  '-1',
  'NaN',
  '1e309',
  '..',
  'u_',
)

/** `?version=` values that can never be a record's real version. */
const hostileVersion = fc.oneof(
  fc.constantFrom(
    '',
    'abc',
    '-1',
    'NaN',
    'Infinity',
    '1e309',
    '1.5',
    "1' OR '1'='1",
    '999999999999999999999',
  ),
  fc.integer({ min: 1000, max: 2 ** 31 }).map(String),
)

// ---------------------------------------------------------------- the fixture and the cases

interface Case {
  /** Who sends it (a cookie); fresh each time where a success would end the session. */
  cookie: () => Promise<string>
  params: () => Promise<Record<string, string>>
  /** The route's valid body right now (current versions), or null when it takes none. */
  base: () => Promise<Record<string, unknown> | null>
  /** A DELETE with `?version=`. */
  versionQuery?: boolean
  /** multipart upload (logs preview), raw body (webhooks). */
  kind?: 'json' | 'multipart' | 'raw'
}

let f: CrewFixture
let admin: TestUser
let advisor: TestUser
let reviewId = ''
let partId = ''
let invitationId = ''
let uploadId = ''
let fixtureIds: string[] = []

const get = async (path: string, cookie: string) => {
  const res = await request(app).get(path).set('Cookie', cookie)
  if (res.status !== 200) throw new Error(`${path}: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body as Record<string, unknown> & { version: number }
}

/** A throwaway member with a fresh session, for routes whose success ends sessions or changes the password. */
async function throwaway(): Promise<string> {
  return (await createUser(ctx, { displayName: 'Throwaway' })).cookie
}

function cases(): Record<string, Case> {
  const owner = async () => f.owner.cookie
  const editor = async () => f.editor.cookie
  const v = async () => ({ vehicleId: f.vehicleId })
  const none = async () => null
  const TRIP = { days: 3, startDate: '2027-02-08' }
  return {
    'POST /api/vehicles': {
      cookie: owner,
      params: async () => ({}),
      base: async () => ({ name: 'Van', kind: 'van', systemVoltageV: 12 }),
    },
    'PATCH /api/vehicles/:vehicleId': {
      cookie: editor,
      params: v,
      base: async () => ({
        version: (await get(`/api/vehicles/${f.vehicleId}`, f.owner.cookie)).version,
        notes: 'n',
      }),
    },
    'DELETE /api/vehicles/:vehicleId': { cookie: owner, params: v, base: none, versionQuery: true },
    'PUT /api/vehicles/:vehicleId/battery': {
      cookie: editor,
      params: v,
      base: async () => ({
        version: (await get(`/api/vehicles/${f.vehicleId}/battery`, f.owner.cookie)).version,
        battery: { chemistry: 'lfp', cellsSeries: 4, cellsParallel: 1, capacityAh: 200 },
      }),
    },
    'PUT /api/vehicles/:vehicleId/inverter': {
      cookie: editor,
      params: v,
      base: async () => ({
        version: (await get(`/api/vehicles/${f.vehicleId}/inverter`, f.owner.cookie)).version,
        inverter: { ratedPowerW: 1500, efficiencyFraction: 0.9, idleW: 8 },
      }),
    },
    'POST /api/vehicles/:vehicleId/appliances': {
      cookie: editor,
      params: v,
      base: async () => ({
        name: 'Lamp',
        category: 'lighting',
        powerW: 5,
        supply: 'dc',
        quantity: 1,
        hoursPerDay: 3,
        startHour: 18,
        endHour: 23,
      }),
    },
    'POST /api/vehicles/:vehicleId/appliances/import': {
      cookie: editor,
      params: v,
      base: async () => ({ csv: 'name,category\nx,y\n', confirm: true }),
    },
    'PATCH /api/vehicles/:vehicleId/appliances/:applianceId': {
      cookie: editor,
      params: async () => ({ vehicleId: f.vehicleId, applianceId: f.fridgeId }),
      base: async () => {
        const list = (await get(`/api/vehicles/${f.vehicleId}/appliances`, f.owner.cookie)) as unknown as {
          items: { id: string; version: number }[]
        }
        return { version: list.items.find((a) => a.id === f.fridgeId)!.version, powerW: 45 }
      },
    },
    'DELETE /api/vehicles/:vehicleId/appliances/:applianceId': {
      cookie: editor,
      params: async () => ({ vehicleId: f.vehicleId, applianceId: f.fridgeId }),
      base: none,
      versionQuery: true,
    },
    'POST /api/vehicles/:vehicleId/sources': {
      cookie: editor,
      params: v,
      base: async () => ({ kind: 'dcdc', name: 'DC-DC', currentA: 30 }),
    },
    'PATCH /api/vehicles/:vehicleId/sources/:sourceId': {
      cookie: editor,
      params: async () => ({ vehicleId: f.vehicleId, sourceId: f.sourceId }),
      base: async () => {
        const list = (await get(`/api/vehicles/${f.vehicleId}/sources`, f.owner.cookie)) as unknown as {
          items: { id: string; version: number }[]
        }
        return { version: list.items.find((s) => s.id === f.sourceId)!.version, peakPowerWp: 400 }
      },
    },
    'DELETE /api/vehicles/:vehicleId/sources/:sourceId': {
      cookie: editor,
      params: async () => ({ vehicleId: f.vehicleId, sourceId: f.sourceId }),
      base: none,
      versionQuery: true,
    },
    'POST /api/vehicles/:vehicleId/scenarios': {
      cookie: editor,
      params: v,
      base: async () => ({ name: 'S', trip: TRIP }),
    },
    'PATCH /api/scenarios/:scenarioId': {
      cookie: editor,
      params: async () => ({ scenarioId: f.scenarioId }),
      base: async () => ({
        version: (await get(`/api/scenarios/${f.scenarioId}`, f.owner.cookie)).version,
        notes: 'n',
      }),
    },
    'DELETE /api/scenarios/:scenarioId': {
      cookie: editor,
      params: async () => ({ scenarioId: f.scenarioId }),
      base: none,
      versionQuery: true,
    },
    'POST /api/scenarios/:scenarioId/duplicate': {
      cookie: editor,
      params: async () => ({ scenarioId: f.scenarioId }),
      base: async () => ({ name: 'Copy' }),
    },
    'POST /api/scenarios/:scenarioId/save-change': {
      cookie: editor,
      params: async () => ({ scenarioId: f.scenarioId }),
      base: async () => ({ name: 'Tried', plan: examplePlan('winter-week-lofoten') }),
    },
    'POST /api/vehicles/:vehicleId/scenarios/import': {
      cookie: editor,
      params: v,
      base: async () => ({ format: 'ohmward-plan', version: 2 }),
    },
    'PUT /api/vehicles/:vehicleId/build-sheet/settings': {
      cookie: editor,
      params: v,
      base: async () => ({
        version: (
          (await get(`/api/vehicles/${f.vehicleId}/build-sheet`, f.owner.cookie)).settings as {
            version: number
          }
        ).version,
        checklist: {},
      }),
    },
    'POST /api/vehicles/:vehicleId/parts': {
      cookie: editor,
      params: v,
      base: async () => ({ name: 'Fuse', quantity: '1', unitPrice: '2.50', currency: 'EUR', massKg: null }),
    },
    'PATCH /api/vehicles/:vehicleId/parts/:partId': {
      cookie: editor,
      params: async () => ({ vehicleId: f.vehicleId, partId }),
      base: async () => {
        const list = (await get(`/api/vehicles/${f.vehicleId}/parts`, f.owner.cookie)) as unknown as {
          items: { id: string; version: number }[]
        }
        return { version: list.items.find((p) => p.id === partId)!.version, quantity: 2 }
      },
    },
    'DELETE /api/vehicles/:vehicleId/parts/:partId': {
      cookie: editor,
      params: async () => ({ vehicleId: f.vehicleId, partId }),
      base: none,
      versionQuery: true,
    },
    'POST /api/vehicles/:vehicleId/invitations': {
      cookie: owner,
      params: v,
      base: async () => ({ email: 'someone@test.ohmward.local', role: 'editor' }),
    },
    'DELETE /api/vehicles/:vehicleId/invitations/:invitationId': {
      cookie: owner,
      params: async () => ({ vehicleId: f.vehicleId, invitationId }),
      base: none,
    },
    'PATCH /api/vehicles/:vehicleId/members/:userId': {
      cookie: owner,
      params: async () => ({ vehicleId: f.vehicleId, userId: f.viewer.id }),
      base: async () => ({ role: 'viewer' }),
    },
    'DELETE /api/vehicles/:vehicleId/members/:userId': {
      cookie: owner,
      params: async () => ({ vehicleId: f.vehicleId, userId: f.viewer.id }),
      base: none,
    },
    // The owner cannot leave without handing over first, so every body is refused and nothing changes.
    'POST /api/vehicles/:vehicleId/leave': { cookie: owner, params: v, base: none },
    'POST /api/vehicles/:vehicleId/transfer': {
      cookie: owner,
      params: v,
      base: async () => ({ userId: f.viewer.id }),
    },
    'POST /api/invitations/:token/accept': {
      cookie: editor,
      params: async () => ({ token: 'nosuchtoken' }),
      base: none,
    },
    'POST /api/vehicles/:vehicleId/logs/preview': {
      cookie: editor,
      params: v,
      base: none,
      kind: 'multipart',
    },
    'POST /api/vehicles/:vehicleId/logs/:uploadId/check': {
      cookie: editor,
      params: async () => ({ vehicleId: f.vehicleId, uploadId }),
      base: async () => ({ mapping: { time: 'Time' } }),
    },
    'POST /api/vehicles/:vehicleId/logs/:uploadId/import': {
      cookie: editor,
      params: async () => ({ vehicleId: f.vehicleId, uploadId }),
      base: async () => ({ mapping: { time: 'Time' } }),
    },
    'DELETE /api/logs/:uploadId': {
      cookie: editor,
      params: async () => ({ uploadId }),
      base: none,
      versionQuery: true,
    },
    'POST /api/logs/:uploadId/calibrate': {
      cookie: editor,
      params: async () => ({ uploadId }),
      base: async () => ({ scenarioId: f.scenarioId }),
    },
    'PUT /api/advisors/me': {
      cookie: async () => advisor.cookie,
      params: async () => ({}),
      base: async () => ({
        version:
          ((await get('/api/advisors/me', advisor.cookie)).profile as { version: number } | null)?.version ??
          1,
        headline: 'Van electrics',
        bio: 'b',
        specialities: [],
        feeAmount: '0',
        currency: 'EUR',
        accepting: true,
      }),
    },
    'POST /api/reviews': {
      cookie: owner,
      params: async () => ({}),
      base: async () => ({ scenarioId: f.scenarioId, advisorId: advisor.id, message: 'Please look' }),
    },
    'POST /api/reviews/:reviewId/checkout': { cookie: owner, params: async () => ({ reviewId }), base: none },
    'POST /api/reviews/:reviewId/comments': {
      cookie: owner,
      params: async () => ({ reviewId }),
      base: async () => ({ body: 'A comment', pin: { kind: 'general' } }),
    },
    // The review is free and waiting: the member may not start, close or answer it; the advisor may not cancel.
    'POST /api/reviews/:reviewId/start': { cookie: owner, params: async () => ({ reviewId }), base: none },
    'POST /api/reviews/:reviewId/close': { cookie: owner, params: async () => ({ reviewId }), base: none },
    'POST /api/reviews/:reviewId/cancel': {
      cookie: async () => advisor.cookie,
      params: async () => ({ reviewId }),
      base: none,
    },
    'POST /api/reviews/:reviewId/decline': { cookie: owner, params: async () => ({ reviewId }), base: none },
    'POST /api/reviews/:reviewId/answer': {
      cookie: owner,
      params: async () => ({ reviewId }),
      base: async () => ({ verdict: 'carries', summary: 'ok' }),
    },
    'POST /api/webhooks/payments': { cookie: owner, params: async () => ({}), base: none, kind: 'raw' },
    'POST /api/auth/sign-up': {
      cookie: async () => '',
      params: async () => ({}),
      base: async () => ({ email: 'x@test.ohmward.local', password: 'long-enough-pass-9', displayName: 'X' }),
    },
    'POST /api/auth/sign-in': {
      cookie: async () => '',
      params: async () => ({}),
      base: async () => ({ email: f.owner.email, password: 'wrong-password-here' }),
    },
    'POST /api/auth/sign-out': { cookie: throwaway, params: async () => ({}), base: none },
    'POST /api/auth/sign-out-everywhere': { cookie: throwaway, params: async () => ({}), base: none },
    'POST /api/auth/verify-email': {
      cookie: async () => '',
      params: async () => ({}),
      base: async () => ({ token: 'nosuchtoken' }),
    },
    'POST /api/auth/confirm-email-change': {
      cookie: async () => '',
      params: async () => ({}),
      base: async () => ({ token: 'nosuchtoken' }),
    },
    'POST /api/auth/forgot-password': {
      cookie: async () => '',
      params: async () => ({}),
      base: async () => ({ email: 'nobody@test.ohmward.local' }),
    },
    'POST /api/auth/reset-password': {
      cookie: async () => '',
      params: async () => ({}),
      base: async () => ({ token: 'nosuchtoken', password: 'long-enough-pass-9' }),
    },
    'PATCH /api/account/profile': {
      cookie: owner,
      params: async () => ({}),
      base: async () => ({ displayName: 'Ingrid Owner' }),
    },
    'POST /api/account/password': {
      cookie: owner,
      params: async () => ({}),
      base: async () => ({ currentPassword: 'not-the-password', newPassword: 'another-long-pass-9' }),
    },
    'POST /api/account/email': {
      cookie: owner,
      params: async () => ({}),
      base: async () => ({ newEmail: 'new@test.ohmward.local', currentPassword: 'not-the-password' }),
    },
    'PUT /api/admin/users/:id/role': {
      cookie: async () => admin.cookie,
      params: async () => ({ id: f.outsider.id }),
      base: async () => ({ role: 'member' }),
    },
  }
}

// ---------------------------------------------------------------- the checks

/** A checksum of every row, in every table, whose text mentions one of the fixture's ids. */
async function checksum(): Promise<string> {
  const tables = (
    await ctx.db.execute<{ t: string }>(
      sql`SELECT table_name AS t FROM information_schema.tables
          WHERE table_schema = 'public' AND table_type = 'BASE TABLE'
            AND table_name NOT IN ('sessions', 'user_sessions', 'rate_limits', 'mail_outbox', '__drizzle_migrations')
          ORDER BY 1`,
    )
  ).rows.map((r) => r.t)
  const pattern = fixtureIds.map((x) => x.replace(/[^a-zA-Z0-9_-]/g, '')).join('|')
  const parts: string[] = []
  for (const t of tables) {
    const r = await ctx.db.execute<{ n: string; h: string | null }>(
      sql`SELECT count(*)::text AS n, md5(string_agg(x::text, '|' ORDER BY x::text)) AS h
          FROM ${sql.identifier(t)} x WHERE x::text ~ ${pattern}`,
    )
    parts.push(`${t}:${r.rows[0]!.n}:${r.rows[0]!.h ?? '-'}`)
  }
  const mail = await ctx.db.execute<{ n: string }>(
    sql`SELECT count(*)::text AS n FROM mail_outbox x WHERE x::text ~ ${pattern}`,
  )
  parts.push(`mail:${mail.rows[0]!.n}`)
  return parts.join('\n')
}

function fillPath(pattern: string, params: Record<string, string>): string {
  return pattern.replace(/:([A-Za-z]+)/g, (_m, k: string) => encodeURIComponent(params[k] ?? ''))
}

interface Sent {
  status: number
  body: unknown
  what: string
}

async function send(
  route: string,
  c: Case,
  body: unknown,
  params: Record<string, string>,
  version?: string,
): Promise<Sent> {
  const [method, pattern] = route.split(' ') as [string, string]
  let path = fillPath(pattern, params)
  if (version !== undefined) path += `?version=${encodeURIComponent(version)}`
  const cookie = await c.cookie()
  let req = request(app)[method.toLowerCase() as 'post'](path).set('Accept', 'application/json')
  // A fake client address per request, so the auth limits of the shared 127.0.0.1 are not used up.
  req = req.set(
    'X-Forwarded-For',
    `10.${(Math.random() * 250) | 0}.${(Math.random() * 250) | 0}.${(Math.random() * 250) | 0}`,
  )
  if (cookie) req = req.set('Cookie', cookie)
  let res: request.Response
  const text = typeof body === 'string' ? body : JSON.stringify(body)
  if (c.kind === 'multipart') {
    res = await req
      .field('mapping', text.slice(0, 1000))
      .attach('file', Buffer.from(text ?? ''), { filename: 'log.csv', contentType: 'text/csv' })
  } else if (c.kind === 'raw') {
    res = await req
      .set('Content-Type', 'application/json')
      .set('Stripe-Signature', 't=1,v1=00')
      .send(text ?? '')
  } else {
    res = await req.set('Content-Type', 'application/json').send(text ?? 'null')
  }
  return {
    status: res.status,
    body: res.body,
    what: `${method} ${path.slice(0, 200)} ${String(text).slice(0, 200)}`,
  }
}

function expectErrorShape(r: Sent): void {
  const b = r.body as { error?: { code?: unknown; message?: unknown } }
  expect(
    typeof b?.error?.code,
    `${r.status} without error.code: ${r.what} → ${JSON.stringify(r.body).slice(0, 300)}`,
  ).toBe('string')
  expect(typeof b?.error?.message, `${r.status} without error.message: ${r.what}`).toBe('string')
}

// ---------------------------------------------------------------- the tests

beforeAll(async () => {
  f = await crewFixture(ctx, app)
  admin = await createUser(ctx, { role: 'admin', displayName: 'Ada Admin' })
  advisor = await advisorWithProfile(ctx, app, '0', 'EUR', 'Frida Free')
  const review = await request(app)
    .post('/api/reviews')
    .set('Cookie', f.owner.cookie)
    .send({ scenarioId: f.scenarioId, advisorId: advisor.id, message: 'Is the pack big enough?' })
  if (review.status !== 201) throw new Error(`review: ${review.status} ${JSON.stringify(review.body)}`)
  reviewId = review.body.id
  const part = await request(app)
    .post(`/api/vehicles/${f.vehicleId}/parts`)
    .set('Cookie', f.owner.cookie)
    .send({ name: 'Main fuse 200 A', quantity: '1', unitPrice: '24.90', currency: 'EUR', massKg: null })
  if (part.status !== 201) throw new Error(`part: ${part.status} ${JSON.stringify(part.body)}`)
  partId = part.body.id
  const inv = await request(app)
    .post(`/api/vehicles/${f.vehicleId}/invitations`)
    .set('Cookie', f.owner.cookie)
    .send({ email: `pending-${f.owner.id}@test.ohmward.local`, role: 'viewer' })
  if (inv.status !== 201) throw new Error(`invitation: ${inv.status} ${JSON.stringify(inv.body)}`)
  invitationId = inv.body.id
  const csv =
    'Time,Pack voltage (V),Current (A)\n2027-02-08 00:00:00,13.3,-9.9\n2027-02-08 00:01:00,13.3,-10.1\n'
  const up = await request(app)
    .post(`/api/vehicles/${f.vehicleId}/logs/preview`)
    .set('Cookie', f.owner.cookie)
    .attach('file', Buffer.from(csv), { filename: 'log.csv', contentType: 'text/csv' })
  if (up.status >= 300) throw new Error(`log preview: ${up.status} ${JSON.stringify(up.body)}`)
  uploadId = up.body.uploadId
  fixtureIds = [
    f.vehicleId,
    f.scenarioId,
    reviewId,
    partId,
    invitationId,
    uploadId,
    ...[f.owner, f.editor, f.viewer, f.advisorMember, f.outsider, advisor, admin].map((u) => u.id),
  ]
}, 60_000)

describe('bad input on every write route', () => {
  it('has a case for every mounted POST/PUT/PATCH/DELETE route, and no case for a route that is gone', () => {
    const mounted = writeRoutes()
    expect(mounted.length).toBeGreaterThan(40)
    const covered = Object.keys(cases()).sort()
    expect(
      mounted.filter((r) => !covered.includes(r)),
      'write routes without a bad-input case',
    ).toEqual([])
    expect(
      covered.filter((r) => !mounted.includes(r)),
      'cases for routes that are not mounted',
    ).toEqual([])
  })

  const all = Object.entries(cases())
  it.each(all.map(([route]) => [route]))(
    '%s: never 5xx, always the error shape, nothing changed when refused',
    async (route) => {
      const c = cases()[route]!
      const problems: string[] = []
      let refused = 0
      let before = await checksum()
      const params = await c.params()
      const paramNames = Object.keys(params)

      // Bodies (and, for DELETE, version queries) against the real rows. A body built on the valid one is
      // rebuilt on the current versions each run, so its refusal is about the hostile part, not a stale version.
      const keys = Object.keys((await c.base()) ?? {})
      const arb: fc.Arbitrary<{ body: Mutation; version?: string }> = c.versionQuery
        ? fc.record({ body: hostile.map((v) => () => v), version: hostileVersion })
        : bodyFor(keys).map((body) => ({ body }))
      await fc.assert(
        fc.asyncProperty(arb, async ({ body, version }) => {
          const r = await send(route, c, body(await c.base()), params, version)
          if (r.status >= 500) {
            problems.push(`${r.status}: ${r.what} → ${JSON.stringify(r.body).slice(0, 300)}`)
            return
          }
          if (r.status >= 400) {
            refused++
            expectErrorShape(r)
            const after = await checksum()
            if (after !== before) problems.push(`${r.status} but rows changed: ${r.what}`)
            before = after
          } else if (c.versionQuery) {
            // No generated version is a record's real one, so a DELETE must never be accepted.
            problems.push(`${r.status} accepted a hostile version: ${r.what}`)
            before = await checksum()
          } else {
            before = await checksum() // accepted: a new baseline
          }
        }),
        { numRuns: RUNS, seed: SEED, endOnFailure: true },
      )

      // Hostile path parameters, one at a time, with the valid body.
      if (paramNames.length) {
        await fc.assert(
          fc.asyncProperty(fc.constantFrom(...paramNames), hostileParam, async (name, value) => {
            const r = await send(
              route,
              c,
              (await c.base()) ?? {},
              { ...params, [name]: value },
              c.versionQuery ? '1' : undefined,
            )
            if (r.status >= 500) {
              problems.push(`${r.status}: ${r.what} → ${JSON.stringify(r.body).slice(0, 300)}`)
              return
            }
            expect(r.status, r.what).toBeGreaterThanOrEqual(400)
            refused++
            expectErrorShape(r)
            const after = await checksum()
            if (after !== before) problems.push(`${r.status} but rows changed: ${r.what}`)
            before = after
          }),
          { numRuns: Math.max(5, Math.round(RUNS / 2)), seed: SEED, endOnFailure: true },
        )
      }
      expect(problems, problems.join('\n')).toEqual([])
      expect(refused).toBeGreaterThan(0)
    },
    120_000,
  )
})
