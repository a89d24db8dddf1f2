/**
 * Fixtures for the sharing and review tests (issue 8): a vehicle with a full crew, a scenario, a fridge and a
 * solar array made through the API; advisors with profiles; signed payment events; the mail outbox.
 */
import request from 'supertest'
import { and, desc, eq } from 'drizzle-orm'
import Stripe from 'stripe'
import type { AppContext } from '../../server/context'
import { mailOutbox, vehicleMemberships } from '../../server/db/schema/index'
import { createUser, type TestUser } from './factories'

export type Target = Parameters<typeof request>[0]

export const TRIP = {
  startDate: '2027-02-08',
  days: 3,
  latitudeDeg: 68.2,
  longitudeDeg: 13.6,
  timeZone: 'Europe/Oslo',
  sky: 'mixed',
  nightLowC: -9,
  dayHighC: -2,
  startSocFraction: 0.9,
  dayPlan: { kind: 'week', days: Array.from({ length: 7 }, () => ({ drivingHours: 0, hookup: false })) },
}

export const FRIDGE = {
  name: 'Compressor fridge 50 L',
  category: 'fridge',
  powerW: 45,
  supply: 'dc',
  quantity: 1,
  dutyCycleFraction: 0.25,
  hoursPerDay: 24,
  startHour: 0,
  endHour: 0,
}

export const SOLAR = {
  kind: 'solar',
  name: 'Roof panels 2 × 200 Wp',
  peakPowerWp: 400,
  tiltDeg: 0,
  azimuthDeg: 180,
  controller: 'mppt',
  maxCurrentA: 30,
}

export interface CrewFixture {
  owner: TestUser
  editor: TestUser
  viewer: TestUser
  advisorMember: TestUser
  outsider: TestUser
  vehicleId: string
  scenarioId: string
  fridgeId: string
  sourceId: string
}

function ok<T>(res: request.Response, what: string): T {
  if (res.status >= 300) throw new Error(`${what}: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body as T
}

/** An owner's vehicle (through the API) plus an editor, a viewer and an advisor on its crew, and an outsider. */
export async function crewFixture(ctx: AppContext, app: Target): Promise<CrewFixture> {
  const [owner, editor, viewer, advisorMember, outsider] = await Promise.all([
    createUser(ctx, { displayName: 'Ingrid Owner' }),
    createUser(ctx, { displayName: 'Eirik Editor' }),
    createUser(ctx, { displayName: 'Vera Viewer' }),
    createUser(ctx, { displayName: 'Aksel Advisor', role: 'advisor' }),
    createUser(ctx, { displayName: 'Olav Outsider' }),
  ])
  const v = ok<{ id: string }>(
    await request(app)
      .post('/api/vehicles')
      .set('Cookie', owner.cookie)
      .send({ name: 'Sprinter “Fjordlys”', kind: 'van', systemVoltageV: 12 }),
    'create vehicle',
  )
  const fridge = ok<{ id: string }>(
    await request(app).post(`/api/vehicles/${v.id}/appliances`).set('Cookie', owner.cookie).send(FRIDGE),
    'create fridge',
  )
  const source = ok<{ id: string }>(
    await request(app).post(`/api/vehicles/${v.id}/sources`).set('Cookie', owner.cookie).send(SOLAR),
    'create source',
  )
  const sc = ok<{ id: string }>(
    await request(app)
      .post(`/api/vehicles/${v.id}/scenarios`)
      .set('Cookie', owner.cookie)
      .send({ name: 'Winter week, Lofoten', trip: TRIP }),
    'create scenario',
  )
  await ctx.db.insert(vehicleMemberships).values([
    { vehicleId: v.id, userId: editor.id, role: 'editor' },
    { vehicleId: v.id, userId: viewer.id, role: 'viewer' },
    { vehicleId: v.id, userId: advisorMember.id, role: 'advisor' },
  ])
  return {
    owner,
    editor,
    viewer,
    advisorMember,
    outsider,
    vehicleId: v.id,
    scenarioId: sc.id,
    fridgeId: fridge.id,
    sourceId: source.id,
  }
}

/** An advisor account with a directory profile. `fee` "0" reviews for free. */
export async function advisorWithProfile(
  ctx: AppContext,
  app: Target,
  fee = '45.00',
  currency = 'EUR',
  displayName = 'Halvor Installer',
): Promise<TestUser> {
  const adv = await createUser(ctx, { role: 'advisor', displayName })
  ok(
    await request(app)
      .put('/api/advisors/me')
      .set('Cookie', adv.cookie)
      .send({
        version: 0,
        headline: 'Van electrics',
        bio: 'Twenty years of wiring vans and boats.',
        specialities: ['LFP packs'],
        feeAmount: fee,
        currency,
        accepting: true,
      }),
    'advisor profile',
  )
  return adv
}

/** The newest queued or sent mail to an address (optionally of a kind), from the outbox. */
export async function lastMail(ctx: AppContext, to: string, kind?: string) {
  const rows = await ctx.db
    .select()
    .from(mailOutbox)
    .where(kind ? and(eq(mailOutbox.toAddress, to), eq(mailOutbox.kind, kind)) : eq(mailOutbox.toAddress, to))
    .orderBy(desc(mailOutbox.id))
    .limit(1)
  return rows[0] ?? null
}

export async function mailCount(ctx: AppContext, to: string, kind?: string): Promise<number> {
  const rows = await ctx.db
    .select({ id: mailOutbox.id })
    .from(mailOutbox)
    .where(kind ? and(eq(mailOutbox.toAddress, to), eq(mailOutbox.kind, kind)) : eq(mailOutbox.toAddress, to))
  return rows.length
}

const signer = new Stripe('sk_test_signer', { telemetry: false })

/** A payment event as the provider sends it, with a valid signature for `secret`. */
export function signedEvent(
  type: string,
  object: Record<string, unknown>,
  secret = 'whsec_ohmward_local',
  id = `evt_test_${Math.random().toString(36).slice(2)}`,
) {
  const payload = JSON.stringify({
    id,
    object: 'event',
    type,
    created: Math.floor(Date.now() / 1000),
    livemode: false,
    data: { object },
  })
  return { id, payload, signature: signer.webhooks.generateTestHeaderString({ payload, secret }) }
}

/** The local payment fake's address (npm test sets STRIPE_API_URL). */
export const fakePaymentsUrl = () => {
  const u = process.env.STRIPE_API_URL
  if (!u) throw new Error('STRIPE_API_URL is not set: run the tests with npm test')
  return u
}

/** A Playwright cookie for a test user's session (so a story can start signed in). */
export function sessionCookie(user: { cookie: string }, url: string) {
  const [name, ...rest] = user.cookie.split('=')
  return { name: name!, value: rest.join('='), url }
}

/** Wait for a mail to arrive at the local fake SMTP server (read through its HTTP API). */
export async function waitForMail(
  to: string,
  match: (m: { subject: string; text: string }) => boolean,
  timeoutMs = 15_000,
) {
  const api = process.env.OHMWARD_FAKE_MAIL_API
  if (!api) throw new Error('OHMWARD_FAKE_MAIL_API is not set: run the tests with npm test')
  const until = Date.now() + timeoutMs
  while (Date.now() < until) {
    const r = (await fetch(`${api}/messages?to=${encodeURIComponent(to)}`).then((x) => x.json())) as {
      messages: { subject: string; text: string }[]
    }
    const hit = r.messages.find(match)
    if (hit) return hit
    await new Promise((ok) => setTimeout(ok, 250))
  }
  throw new Error(`no mail to ${to} matched within ${timeoutMs} ms`)
}
