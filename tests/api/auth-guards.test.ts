import { describe, it, expect, afterAll } from 'vitest'
import request from 'supertest'
import express from 'express'
import { createApp } from '../../server/app'
import { testContext, uniq } from '../support/context'
import { createUser } from '../support/factories'
import { requireMembership, type MembershipRole } from '../../server/auth/authorize'
import { sessionMiddleware } from '../../server/middleware/session'
import { errorHandler } from '../../server/middleware/error-handler'

const ctx = testContext()
const app = createApp(ctx)
afterAll(() => ctx.pool.end())

/** A client address of its own, so the shared rate-limit table does not mix this test with others. */
const clientIp = () =>
  `10.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`

describe('rate limits (PostgreSQL-backed, per client address)', () => {
  const limited = testContext({ AUTH_RATE_LIMIT_MAX: '3', AUTH_RATE_LIMIT_WINDOW_SECONDS: '60' })
  const limitedApp = createApp(limited)
  afterAll(() => limited.pool.end())

  it('trips sign-in after the limit with a 429 in the error shape, per address', async () => {
    const ip = clientIp()
    const body = { email: `${uniq()}@test.ohmward.local`, password: 'whatever it is' }
    for (let i = 0; i < 3; i++) {
      await request(limitedApp).post('/api/auth/sign-in').set('x-forwarded-for', ip).send(body).expect(400)
    }
    const res = await request(limitedApp)
      .post('/api/auth/sign-in')
      .set('x-forwarded-for', ip)
      .send(body)
      .expect(429)
    expect(res.body.error.code).toBe('rate_limited')
    expect(res.body.error.message).toMatch(/Too many attempts/)
    // Another address is not affected.
    await request(limitedApp)
      .post('/api/auth/sign-in')
      .set('x-forwarded-for', clientIp())
      .send(body)
      .expect(400)
  })

  it('counts only failed sign-ins: a household on one address signs in more often than the limit', async () => {
    const ip = clientIp()
    const user = await createUser(limited)
    const good = { email: user.email, password: user.password }
    for (let i = 0; i < 5; i++)
      await request(limitedApp).post('/api/auth/sign-in').set('x-forwarded-for', ip).send(good).expect(200)
    // Wrong passwords still trip it after the limit, and then the right one waits too.
    const bad = { email: user.email, password: 'not the password' }
    for (let i = 0; i < 3; i++)
      await request(limitedApp).post('/api/auth/sign-in').set('x-forwarded-for', ip).send(bad).expect(400)
    await request(limitedApp).post('/api/auth/sign-in').set('x-forwarded-for', ip).send(bad).expect(429)
    await request(limitedApp).post('/api/auth/sign-in').set('x-forwarded-for', ip).send(good).expect(429)
  })

  it('counts across server processes that share the database', async () => {
    const second = testContext({ AUTH_RATE_LIMIT_MAX: '3', AUTH_RATE_LIMIT_WINDOW_SECONDS: '60' })
    const secondApp = createApp(second)
    const ip = clientIp()
    const body = { email: `${uniq()}@test.ohmward.local` }
    await request(limitedApp)
      .post('/api/auth/forgot-password')
      .set('x-forwarded-for', ip)
      .send(body)
      .expect(202)
    await request(secondApp)
      .post('/api/auth/forgot-password')
      .set('x-forwarded-for', ip)
      .send(body)
      .expect(202)
    await request(limitedApp)
      .post('/api/auth/forgot-password')
      .set('x-forwarded-for', ip)
      .send(body)
      .expect(202)
    await request(secondApp)
      .post('/api/auth/forgot-password')
      .set('x-forwarded-for', ip)
      .send(body)
      .expect(429)
    await second.pool.end()
  })

  it('limits sign-up too', async () => {
    const ip = clientIp()
    const send = () =>
      request(limitedApp)
        .post('/api/auth/sign-up')
        .set('x-forwarded-for', ip)
        .send({ email: `${uniq()}@test.ohmward.local`, displayName: 'R', password: 'long enough passphrase' })
    for (let i = 0; i < 3; i++) await send().expect(202)
    await send().expect(429)
  })
})

describe('cross-site requests (CSRF)', () => {
  it('refuses a cross-origin POST to sign-in and to a signed-in route, and lets a same-origin one through', async () => {
    const u = await createUser(ctx)
    const evil = await request(app)
      .post('/api/auth/sign-in')
      .set('origin', 'https://evil.example')
      .send({ email: u.email, password: u.password })
      .expect(403)
    expect(evil.body.error).toEqual({ code: 'forbidden', message: 'Cross-site requests are not accepted.' })
    await request(app)
      .post('/api/auth/sign-out-everywhere')
      .set('cookie', u.cookie)
      .set('sec-fetch-site', 'cross-site')
      .expect(403)
    // Still signed in: the refused request changed nothing.
    expect((await request(app).get('/api/auth/me').set('cookie', u.cookie)).body.user.id).toBe(u.id)

    const same = await request(app)
      .post('/api/auth/sign-in')
      .set('host', 'ohmward.test')
      .set('origin', 'http://ohmward.test')
      .send({ email: u.email, password: u.password })
    expect(same.status).toBe(200)
  })
})

describe('uniform answers and timing for sign-in', () => {
  it('does the password work for an unknown e-mail too (no fast path that tells)', async () => {
    const u = await createUser(ctx)
    const time = async (email: string) => {
      const t0 = performance.now()
      await request(app)
        .post('/api/auth/sign-in')
        .send({ email, password: 'wrong password here' })
        .expect(400)
      return performance.now() - t0
    }
    await time(u.email) // warm up (the dummy hash is made on first use)
    await time(`${uniq()}@test.ohmward.local`)
    const known: number[] = []
    const unknown: number[] = []
    for (let i = 0; i < 5; i++) {
      known.push(await time(u.email))
      unknown.push(await time(`${uniq()}@test.ohmward.local`))
    }
    const median = (xs: number[]) => xs.sort((a, b) => a - b)[2]!
    // Both run one argon2id verification (tens of ms); a skipped verification would be ~20x faster.
    // The bound is loose on purpose: this checks the mechanism, not a speed target.
    expect(median(unknown) / median(known)).toBeGreaterThan(0.4)
  })
})

describe('roles', () => {
  it('answers 401 signed out, 403 for a member or an advisor, and lists users for an admin', async () => {
    const member = await createUser(ctx)
    const advisor = await createUser(ctx, { role: 'advisor' })
    const admin = await createUser(ctx, { role: 'admin' })
    await request(app).get('/api/admin/users').expect(401)
    const m = await request(app).get('/api/admin/users').set('cookie', member.cookie).expect(403)
    expect(m.body.error.code).toBe('forbidden')
    await request(app).get('/api/admin/users').set('cookie', advisor.cookie).expect(403)
    await request(app)
      .put(`/api/admin/users/${member.id}/role`)
      .set('cookie', member.cookie)
      .send({ role: 'advisor' })
      .expect(403)

    const list = await request(app)
      .get('/api/admin/users')
      .query({ q: member.email, page: 1, pageSize: 5 })
      .set('cookie', admin.cookie)
      .expect(200)
    expect(list.body).toMatchObject({ total: 1, page: 1, pageSize: 5 })
    expect(list.body.items[0]).toMatchObject({ id: member.id, role: 'member', emailVerified: true })
    expect(list.body.items[0].passwordHash).toBeUndefined()
  })

  it('paginates and searches by name', async () => {
    const admin = await createUser(ctx, { role: 'admin' })
    const tag = uniq('Pager')
    for (let i = 0; i < 5; i++) await createUser(ctx, { displayName: `${tag} ${i}` })
    const p1 = await request(app)
      .get('/api/admin/users')
      .query({ q: tag, pageSize: 2 })
      .set('cookie', admin.cookie)
    const p3 = await request(app)
      .get('/api/admin/users')
      .query({ q: tag, pageSize: 2, page: 3 })
      .set('cookie', admin.cookie)
    expect(p1.body.total).toBe(5)
    expect(p1.body.items).toHaveLength(2)
    expect(p3.body.items).toHaveLength(1)
    const bad = await request(app)
      .get('/api/admin/users')
      .query({ page: 0 })
      .set('cookie', admin.cookie)
      .expect(400)
    expect(bad.body.error.fields.page).toBeDefined()
    // A % in the search is a literal character, not a wildcard.
    const pct = await request(app)
      .get('/api/admin/users')
      .query({ q: '%' })
      .set('cookie', admin.cookie)
      .expect(200)
    expect(pct.body.total).toBe(0)
  })

  it('grants and removes the advisor role, and the change applies at once', async () => {
    const admin = await createUser(ctx, { role: 'admin' })
    const member = await createUser(ctx)
    const up = await request(app)
      .put(`/api/admin/users/${member.id}/role`)
      .set('cookie', admin.cookie)
      .send({ role: 'advisor' })
      .expect(200)
    expect(up.body.user.role).toBe('advisor')
    expect((await request(app).get('/api/auth/me').set('cookie', member.cookie)).body.user.role).toBe(
      'advisor',
    )
    await request(app)
      .put(`/api/admin/users/${member.id}/role`)
      .set('cookie', admin.cookie)
      .send({ role: 'member' })
      .expect(200)
    expect((await request(app).get('/api/auth/me').set('cookie', member.cookie)).body.user.role).toBe(
      'member',
    )

    const toAdmin = await request(app)
      .put(`/api/admin/users/${member.id}/role`)
      .set('cookie', admin.cookie)
      .send({ role: 'admin' })
      .expect(400)
    expect(toAdmin.body.error.fields.role).toBeDefined()
    const other = await createUser(ctx, { role: 'admin' })
    await request(app)
      .put(`/api/admin/users/${other.id}/role`)
      .set('cookie', admin.cookie)
      .send({ role: 'member' })
      .expect(400)
    await request(app)
      .put(`/api/admin/users/nobody/role`)
      .set('cookie', admin.cookie)
      .send({ role: 'advisor' })
      .expect(404)
  })
})

describe('requireMembership (the per-vehicle hook later issues use)', () => {
  const roles = new Map<string, MembershipRole>()
  const hookApp = express()
  hookApp.use(sessionMiddleware(ctx.lucia))
  hookApp.put(
    '/things/:thingId',
    requireMembership(ctx, async (_c, userId, id) => roles.get(`${userId}:${id}`) ?? null, {
      param: 'thingId',
      roles: ['owner', 'editor'],
      what: 'Vehicle',
    }),
    (_req, res) => {
      res.json({ role: res.locals.membershipRole })
    },
  )
  hookApp.use(errorHandler)

  it('answers 401, 404 (no role: existence not revealed), 403 (role too small) and passes an editor', async () => {
    const u = await createUser(ctx)
    roles.set(`${u.id}:v1`, 'viewer')
    roles.set(`${u.id}:v2`, 'editor')
    await request(hookApp).put('/things/v1').expect(401)
    const none = await request(hookApp).put('/things/v0').set('cookie', u.cookie).expect(404)
    expect(none.body.error.message).toBe('Vehicle was not found.')
    const viewer = await request(hookApp).put('/things/v1').set('cookie', u.cookie).expect(403)
    expect(viewer.body.error.message).toMatch(/viewer/)
    expect((await request(hookApp).put('/things/v2').set('cookie', u.cookie).expect(200)).body.role).toBe(
      'editor',
    )
  })
})

describe('the local mailbox API (/dev/mailbox)', () => {
  it('lists the fake SMTP server’s messages in development and test', async () => {
    const res = await request(app).get('/dev/mailbox/messages').expect(200)
    expect(Array.isArray(res.body.messages)).toBe(true)
    await request(app).get('/dev/mailbox/messages/does-not-exist').expect(404)
  })

  it('is not mounted in production', async () => {
    const prod = testContext({ NODE_ENV: 'production' })
    const res = await request(createApp(prod)).get('/dev/mailbox/messages')
    expect(res.status).toBe(404)
    expect(res.headers['content-type'] ?? '').not.toMatch(/json/)
    await prod.pool.end()
  })
})
