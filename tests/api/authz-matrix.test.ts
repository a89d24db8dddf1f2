/**
 * The authorization matrix (issue 8): every vehicle, scenario, crew, comment and review route × owner,
 * editor, viewer, advisor (crew member with the advisor role), non-member and signed-out, one test per cell.
 *
 *   allow = the role gets past authorization (2xx, or a domain answer such as 409/422 — never 401/403/404)
 *   403   = a member whose role does not allow it
 *   404   = a non-member (existence is not revealed)
 *   401   = signed out
 *
 * Write cells that succeed change state, so rows that consume their target prepare a fresh one per cell.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import request from 'supertest'
import { readFileSync } from 'node:fs'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { advisorWithProfile, crewFixture, FRIDGE, SOLAR, TRIP, type CrewFixture } from '../support/sharing'

const ctx = testContext({ APP_URL: 'http://127.0.0.1:39997' })
const app = createApp(ctx)
afterAll(() => ctx.pool.end())

const ROLES = ['owner', 'editor', 'viewer', 'advisor', 'nonMember', 'signedOut'] as const
type Role = (typeof ROLES)[number]
type Expect = 'allow' | 403 | 404 | 401
type Ids = Record<string, string>

const BATTERY = (
  JSON.parse(
    readFileSync(new URL('../../data/examples/winter-week-lofoten.json', import.meta.url), 'utf8'),
  ) as { battery: unknown }
).battery

/** Everyone reads, nobody outside. */
const READ: Record<Role, Expect> = {
  owner: 'allow',
  editor: 'allow',
  viewer: 'allow',
  advisor: 'allow',
  nonMember: 404,
  signedOut: 401,
}
/** Owner and editor write. */
const WRITE: Record<Role, Expect> = {
  owner: 'allow',
  editor: 'allow',
  viewer: 403,
  advisor: 403,
  nonMember: 404,
  signedOut: 401,
}
/** Owner only. */
const OWNER: Record<Role, Expect> = {
  owner: 'allow',
  editor: 403,
  viewer: 403,
  advisor: 403,
  nonMember: 404,
  signedOut: 401,
}
/** Only the review's own advisor (not a crew role): every crew role is refused. */
const REVIEW_ADVISOR_ONLY: Record<Role, Expect> = {
  owner: 403,
  editor: 403,
  viewer: 403,
  advisor: 403,
  nonMember: 404,
  signedOut: 401,
}
/** Any signed-in account (the lists filter by membership). */
const SIGNED_IN: Record<Role, Expect> = {
  owner: 'allow',
  editor: 'allow',
  viewer: 'allow',
  advisor: 'allow',
  nonMember: 'allow',
  signedOut: 401,
}

interface Row {
  route: string
  method: 'get' | 'post' | 'patch' | 'put' | 'delete'
  path: (ids: Ids) => string
  body?: (ids: Ids) => Promise<unknown> | unknown
  /** Runs before each cell, for rows whose allowed cells use up their target. */
  prepare?: () => Promise<Ids>
  expect: Record<Role, Expect>
}

let f: CrewFixture
let base: Ids
const owner = () => request(app)
const version = async (path: string) =>
  (await owner().get(path).set('Cookie', f.owner.cookie).expect(200)).body.version as number
let n = 0
const uniqueName = (p: string) => `${p} ${++n}`

async function newAppliance(): Promise<Ids> {
  const r = await owner()
    .post(`/api/vehicles/${f.vehicleId}/appliances`)
    .set('Cookie', f.owner.cookie)
    .send({ ...FRIDGE, name: uniqueName('Fan') })
  return { ...base, applianceId: r.body.id }
}
async function newSource(): Promise<Ids> {
  const r = await owner()
    .post(`/api/vehicles/${f.vehicleId}/sources`)
    .set('Cookie', f.owner.cookie)
    .send({ ...SOLAR, name: uniqueName('Panel') })
  return { ...base, sourceId: r.body.id }
}
async function newScenario(): Promise<Ids> {
  const r = await owner()
    .post(`/api/vehicles/${f.vehicleId}/scenarios`)
    .set('Cookie', f.owner.cookie)
    .send({ name: uniqueName('Trip'), trip: TRIP })
  return { ...base, scenarioId: r.body.id }
}
/** A fresh free review by the owner (each needs its own advisor: one open review per scenario and advisor). */
async function newReview(): Promise<Ids> {
  const adv = await advisorWithProfile(ctx, app, '0', 'EUR', uniqueName('Advisor'))
  const r = await owner()
    .post('/api/reviews')
    .set('Cookie', f.owner.cookie)
    .send({ scenarioId: f.scenarioId, advisorId: adv.id, message: 'Please look' })
  return { ...base, reviewId: r.body.id }
}
/** A fresh vehicle with the same crew, for rows that delete the vehicle or change the crew. */
async function newCrew(): Promise<Ids> {
  const g = await crewFixture(ctx, app)
  crewOverride = g
  return {
    ...base,
    vehicleId: g.vehicleId,
    scenarioId: g.scenarioId,
    viewerId: g.viewer.id,
    editorId: g.editor.id,
  }
}
let crewOverride: CrewFixture | null = null

const ROWS: Row[] = [
  // ---- vehicles and equipment (issue 5 routes) ----
  { route: 'GET /api/vehicles', method: 'get', path: () => '/api/vehicles', expect: SIGNED_IN },
  {
    route: 'GET /api/vehicles/:id',
    method: 'get',
    path: (i) => `/api/vehicles/${i.vehicleId}`,
    expect: READ,
  },
  {
    route: 'PATCH /api/vehicles/:id',
    method: 'patch',
    path: (i) => `/api/vehicles/${i.vehicleId}`,
    body: async (i) => ({
      version: await version(`/api/vehicles/${i.vehicleId}`),
      notes: uniqueName('note'),
    }),
    expect: WRITE,
  },
  {
    route: 'DELETE /api/vehicles/:id',
    method: 'delete',
    prepare: newCrew,
    path: (i) => `/api/vehicles/${i.vehicleId}?version=1`,
    expect: OWNER,
  },
  {
    route: 'GET /api/vehicles/:id/battery',
    method: 'get',
    path: (i) => `/api/vehicles/${i.vehicleId}/battery`,
    expect: READ,
  },
  {
    route: 'PUT /api/vehicles/:id/battery',
    method: 'put',
    path: (i) => `/api/vehicles/${i.vehicleId}/battery`,
    body: async (i) => ({ version: await version(`/api/vehicles/${i.vehicleId}/battery`), battery: BATTERY }),
    expect: WRITE,
  },
  {
    route: 'GET /api/vehicles/:id/inverter',
    method: 'get',
    path: (i) => `/api/vehicles/${i.vehicleId}/inverter`,
    expect: READ,
  },
  {
    route: 'PUT /api/vehicles/:id/inverter',
    method: 'put',
    path: (i) => `/api/vehicles/${i.vehicleId}/inverter`,
    body: async (i) => ({ version: await version(`/api/vehicles/${i.vehicleId}/inverter`), inverter: null }),
    expect: WRITE,
  },
  {
    route: 'GET /api/vehicles/:id/appliances',
    method: 'get',
    path: (i) => `/api/vehicles/${i.vehicleId}/appliances`,
    expect: READ,
  },
  {
    route: 'GET /api/vehicles/:id/appliances.csv',
    method: 'get',
    path: (i) => `/api/vehicles/${i.vehicleId}/appliances.csv`,
    expect: READ,
  },
  {
    route: 'POST /api/vehicles/:id/appliances',
    method: 'post',
    path: (i) => `/api/vehicles/${i.vehicleId}/appliances`,
    body: () => ({ ...FRIDGE, name: uniqueName('Lamp') }),
    expect: WRITE,
  },
  {
    route: 'PATCH /api/vehicles/:id/appliances/:applianceId',
    method: 'patch',
    prepare: newAppliance,
    path: (i) => `/api/vehicles/${i.vehicleId}/appliances/${i.applianceId}`,
    body: () => ({ version: 1, powerW: 50 }),
    expect: WRITE,
  },
  {
    route: 'DELETE /api/vehicles/:id/appliances/:applianceId',
    method: 'delete',
    prepare: newAppliance,
    path: (i) => `/api/vehicles/${i.vehicleId}/appliances/${i.applianceId}?version=1`,
    expect: WRITE,
  },
  {
    route: 'POST /api/vehicles/:id/appliances/import',
    method: 'post',
    path: (i) => `/api/vehicles/${i.vehicleId}/appliances/import`,
    body: () => ({
      csv: 'name,category,supply,powerW,quantity,hoursPerDay,startHour,endHour\nPump,water,dc,40,1,0.5,7,22\n',
      confirm: false,
    }),
    expect: WRITE,
  },
  {
    route: 'GET /api/vehicles/:id/sources',
    method: 'get',
    path: (i) => `/api/vehicles/${i.vehicleId}/sources`,
    expect: READ,
  },
  {
    route: 'POST /api/vehicles/:id/sources',
    method: 'post',
    path: (i) => `/api/vehicles/${i.vehicleId}/sources`,
    body: () => ({ ...SOLAR, name: uniqueName('Panel') }),
    expect: WRITE,
  },
  {
    route: 'PATCH /api/vehicles/:id/sources/:sourceId',
    method: 'patch',
    prepare: newSource,
    path: (i) => `/api/vehicles/${i.vehicleId}/sources/${i.sourceId}`,
    body: () => ({ version: 1, peakPowerWp: 300 }),
    expect: WRITE,
  },
  {
    route: 'DELETE /api/vehicles/:id/sources/:sourceId',
    method: 'delete',
    prepare: newSource,
    path: (i) => `/api/vehicles/${i.vehicleId}/sources/${i.sourceId}?version=1`,
    expect: WRITE,
  },
  {
    route: 'GET /api/vehicles/:id/history',
    method: 'get',
    path: (i) => `/api/vehicles/${i.vehicleId}/history`,
    expect: READ,
  },
  // ---- scenarios ----
  { route: 'GET /api/scenarios', method: 'get', path: () => '/api/scenarios', expect: SIGNED_IN },
  {
    route: 'GET /api/vehicles/:id/scenarios',
    method: 'get',
    path: (i) => `/api/vehicles/${i.vehicleId}/scenarios`,
    expect: READ,
  },
  {
    route: 'POST /api/vehicles/:id/scenarios',
    method: 'post',
    path: (i) => `/api/vehicles/${i.vehicleId}/scenarios`,
    body: () => ({ name: uniqueName('Trip'), trip: TRIP }),
    expect: WRITE,
  },
  {
    route: 'GET /api/scenarios/:id',
    method: 'get',
    path: (i) => `/api/scenarios/${i.scenarioId}`,
    expect: READ,
  },
  {
    route: 'GET /api/scenarios/:id/plan',
    method: 'get',
    path: (i) => `/api/scenarios/${i.scenarioId}/plan`,
    expect: READ,
  },
  {
    route: 'PATCH /api/scenarios/:id',
    method: 'patch',
    path: (i) => `/api/scenarios/${i.scenarioId}`,
    body: async (i) => ({ version: await version(`/api/scenarios/${i.scenarioId}`), notes: uniqueName('n') }),
    expect: WRITE,
  },
  {
    route: 'DELETE /api/scenarios/:id',
    method: 'delete',
    prepare: newScenario,
    path: (i) => `/api/scenarios/${i.scenarioId}?version=1`,
    expect: WRITE,
  },
  {
    route: 'POST /api/scenarios/:id/duplicate',
    method: 'post',
    path: (i) => `/api/scenarios/${i.scenarioId}/duplicate`,
    body: () => ({ name: uniqueName('Copy') }),
    expect: WRITE,
  },
  // ---- crew ----
  {
    route: 'GET /api/vehicles/:id/crew',
    method: 'get',
    path: (i) => `/api/vehicles/${i.vehicleId}/crew`,
    expect: READ,
  },
  {
    route: 'POST /api/vehicles/:id/invitations',
    method: 'post',
    path: (i) => `/api/vehicles/${i.vehicleId}/invitations`,
    body: () => ({ email: `${uniqueName('guest').replace(' ', '')}@example.org`, role: 'viewer' }),
    expect: OWNER,
  },
  {
    route: 'PATCH /api/vehicles/:id/members/:userId',
    method: 'patch',
    path: (i) => `/api/vehicles/${i.vehicleId}/members/${i.viewerId}`,
    body: () => ({ role: 'viewer' }),
    expect: OWNER,
  },
  {
    route: 'DELETE /api/vehicles/:id/members/:userId',
    method: 'delete',
    prepare: newCrew,
    path: (i) => `/api/vehicles/${i.vehicleId}/members/${i.viewerId}`,
    expect: OWNER,
  },
  {
    route: 'POST /api/vehicles/:id/transfer',
    method: 'post',
    prepare: newCrew,
    path: (i) => `/api/vehicles/${i.vehicleId}/transfer`,
    body: (i) => ({ userId: i.editorId }),
    expect: OWNER,
  },
  {
    route: 'POST /api/vehicles/:id/leave',
    method: 'post',
    prepare: newCrew,
    path: (i) => `/api/vehicles/${i.vehicleId}/leave`,
    // the owner passes authorization and is then told to hand over first (400 owner_cannot_leave)
    expect: {
      owner: 'allow',
      editor: 'allow',
      viewer: 'allow',
      advisor: 'allow',
      nonMember: 404,
      signedOut: 401,
    },
  },
  // ---- reviews and comments ----
  { route: 'GET /api/reviews', method: 'get', path: () => '/api/reviews', expect: SIGNED_IN },
  {
    route: 'POST /api/reviews',
    method: 'post',
    path: () => '/api/reviews',
    body: async () => {
      const adv = await advisorWithProfile(ctx, app, '0', 'EUR', uniqueName('Advisor'))
      return { scenarioId: f.scenarioId, advisorId: adv.id, message: 'Please look' }
    },
    expect: WRITE,
  },
  { route: 'GET /api/reviews/:id', method: 'get', path: (i) => `/api/reviews/${i.reviewId}`, expect: READ },
  {
    route: 'POST /api/reviews/:id/comments',
    method: 'post',
    path: (i) => `/api/reviews/${i.reviewId}/comments`,
    body: (i) => ({ body: 'About the fridge', pin: { kind: 'appliance', itemId: i.fridgeId } }),
    expect: WRITE,
  },
  {
    route: 'POST /api/reviews/:id/checkout',
    method: 'post',
    path: (i) => `/api/reviews/${i.reviewId}/checkout`,
    expect: WRITE,
  },
  {
    route: 'POST /api/reviews/:id/cancel',
    method: 'post',
    prepare: newReview,
    path: (i) => `/api/reviews/${i.reviewId}/cancel`,
    expect: WRITE,
  },
  {
    route: 'POST /api/reviews/:id/close',
    method: 'post',
    path: (i) => `/api/reviews/${i.reviewId}/close`,
    expect: WRITE,
  },
  {
    route: 'POST /api/reviews/:id/start',
    method: 'post',
    path: (i) => `/api/reviews/${i.reviewId}/start`,
    expect: REVIEW_ADVISOR_ONLY,
  },
  {
    route: 'POST /api/reviews/:id/answer',
    method: 'post',
    path: (i) => `/api/reviews/${i.reviewId}/answer`,
    body: () => ({ verdict: 'sound', summary: 'ok' }),
    expect: REVIEW_ADVISOR_ONLY,
  },
  {
    route: 'POST /api/reviews/:id/decline',
    method: 'post',
    path: (i) => `/api/reviews/${i.reviewId}/decline`,
    expect: REVIEW_ADVISOR_ONLY,
  },
]

const cases = ROWS.flatMap((row) => ROLES.map((role) => ({ ...row, role, want: row.expect[role] })))

beforeAll(async () => {
  f = await crewFixture(ctx, app)
  const adv = await advisorWithProfile(ctx, app, '0', 'EUR', 'Matrix Advisor')
  const r = await owner()
    .post('/api/reviews')
    .set('Cookie', f.owner.cookie)
    .send({ scenarioId: f.scenarioId, advisorId: adv.id, message: 'Matrix' })
    .expect(201)
  base = {
    vehicleId: f.vehicleId,
    scenarioId: f.scenarioId,
    fridgeId: f.fridgeId,
    viewerId: f.viewer.id,
    editorId: f.editor.id,
    reviewId: r.body.id,
  }
})

describe('authorization matrix', () => {
  it.each(cases)('$route as $role → $want', async ({ method, path, body, prepare, role, want }) => {
    crewOverride = null
    const ids = prepare ? await prepare() : base
    const who = crewOverride ?? f
    const cookie =
      role === 'signedOut'
        ? null
        : role === 'nonMember'
          ? who.outsider.cookie
          : role === 'advisor'
            ? who.advisorMember.cookie
            : who[role].cookie
    let req = request(app)[method](path(ids))
    if (cookie) req = req.set('Cookie', cookie)
    const res = body ? await req.send((await body(ids)) as object) : await req
    if (want === 'allow') {
      expect([401, 403, 404], `${res.status} ${JSON.stringify(res.body)}`).not.toContain(res.status)
      expect(res.status).toBeLessThan(500)
    } else {
      expect(res.status, JSON.stringify(res.body)).toBe(want)
    }
  })
})
