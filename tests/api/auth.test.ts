import { describe, it, expect, afterAll } from 'vitest'
import request from 'supertest'
import { eq, sql } from 'drizzle-orm'
import { createApp } from '../../server/app'
import { testContext, uniq } from '../support/context'
import { createUser } from '../support/factories'
import { authTokens, sessions, users } from '../../server/db/schema/index'
import { hashToken } from '../../server/auth/tokens'
import { lastMail, mailCount, sessionCookie, tokenFrom } from './auth-helpers'

const ctx = testContext()
const app = createApp(ctx)
afterAll(() => ctx.pool.end())

const email = () => `${uniq('a')}@test.ohmward.local`
const PASSWORD = 'long enough passphrase 7'

/** Sign up and open the verification link; returns the session cookie. */
async function signUpVerified(addr = email(), password = PASSWORD) {
  await request(app)
    .post('/api/auth/sign-up')
    .send({ email: addr, displayName: 'Ada Test', password })
    .expect(202)
  const mail = await lastMail(ctx, addr, 'verify_email')
  const res = await request(app)
    .post('/api/auth/verify-email')
    .send({ token: tokenFrom(mail!.textBody) })
    .expect(200)
  return { email: addr, cookie: sessionCookie(res.headers['set-cookie'])! }
}

describe('sign-up and e-mail verification', () => {
  it('creates an unverified account, mails a link, and the link verifies and signs in once', async () => {
    const addr = email()
    const res = await request(app)
      .post('/api/auth/sign-up')
      .send({ email: addr.toUpperCase(), displayName: '  Ada Test ', password: PASSWORD })
      .expect(202)
    expect(res.body.message).toMatch(/mail is on its way/)
    expect(sessionCookie(res.headers['set-cookie'])).toBeNull()
    const [u] = await ctx.db.select().from(users).where(eq(users.email, addr))
    expect(u).toMatchObject({ displayName: 'Ada Test', role: 'member', emailVerifiedAt: null })
    expect(u!.passwordHash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/)

    const mail = await lastMail(ctx, addr, 'verify_email')
    expect(mail!.subject).toBe('Confirm your e-mail address for Ohmward')
    const token = tokenFrom(mail!.textBody)
    // Only the hash is stored.
    const stored = await ctx.db.select().from(authTokens).where(eq(authTokens.userId, u!.id))
    expect(stored.map((t) => t.tokenHash)).toContain(hashToken(token))
    expect(stored.map((t) => t.tokenHash)).not.toContain(token)

    const v = await request(app).post('/api/auth/verify-email').send({ token }).expect(200)
    expect(v.body.user).toMatchObject({ email: addr, emailVerified: true })
    const cookie = sessionCookie(v.headers['set-cookie'])
    expect(cookie).not.toBeNull()
    const raw = ([] as string[]).concat(v.headers['set-cookie'] as unknown as string[]).join('\n')
    expect(raw).toMatch(/HttpOnly/i)
    expect(raw).toMatch(/SameSite=Lax/i)
    expect(raw).not.toMatch(/Secure/i) // plain http here

    const me = await request(app).get('/api/auth/me').set('cookie', cookie!).expect(200)
    expect(me.body.user.email).toBe(addr)

    const again = await request(app).post('/api/auth/verify-email').send({ token }).expect(400)
    expect(again.body.error.code).toBe('invalid_token')
  })

  it('refuses a weak password with a clear field message and creates nothing', async () => {
    const addr = email()
    const res = await request(app)
      .post('/api/auth/sign-up')
      .send({ email: addr, displayName: 'Ada', password: 'short' })
      .expect(400)
    expect(res.body.error.code).toBe('validation_failed')
    expect(res.body.error.fields.password[0]).toMatch(/at least 10 characters/)
    const bad = await request(app)
      .post('/api/auth/sign-up')
      .send({ email: 'not-an-address', displayName: '', password: 'aaaaaaaaaaaa' })
      .expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['displayName', 'email', 'password'])
    expect(await ctx.db.select().from(users).where(eq(users.email, addr))).toHaveLength(0)
  })

  it('answers a sign-up for a registered address exactly like a new one, and mails the owner instead', async () => {
    const owner = await createUser(ctx)
    const fresh = await request(app)
      .post('/api/auth/sign-up')
      .send({ email: email(), displayName: 'New', password: PASSWORD })
      .expect(202)
    const taken = await request(app)
      .post('/api/auth/sign-up')
      .send({ email: owner.email, displayName: 'Intruder', password: PASSWORD })
      .expect(202)
    expect(taken.body).toEqual(fresh.body)
    expect((await lastMail(ctx, owner.email, 'already_registered'))?.subject).toBe(
      'You already have an Ohmward account',
    )
    const [u] = await ctx.db.select().from(users).where(eq(users.id, owner.id))
    expect(u!.displayName).toBe(owner.displayName) // nothing changed
  })

  it('lets the real owner of an address take over an unverified account someone else started', async () => {
    const addr = email()
    await request(app)
      .post('/api/auth/sign-up')
      .send({ email: addr, displayName: 'Squatter', password: 'squatter pass 123' })
    await request(app)
      .post('/api/auth/sign-up')
      .send({ email: addr, displayName: 'Owner', password: PASSWORD })
    const token = tokenFrom((await lastMail(ctx, addr, 'verify_email'))!.textBody)
    await request(app).post('/api/auth/verify-email').send({ token }).expect(200)
    await request(app)
      .post('/api/auth/sign-in')
      .send({ email: addr, password: 'squatter pass 123' })
      .expect(400)
    const ok = await request(app)
      .post('/api/auth/sign-in')
      .send({ email: addr, password: PASSWORD })
      .expect(200)
    expect(ok.body.user.displayName).toBe('Owner')
  })
})

describe('sign-in and sign-out', () => {
  it('signs in with the right password and answers a wrong password and an unknown e-mail identically', async () => {
    const u = await createUser(ctx)
    const ok = await request(app)
      .post('/api/auth/sign-in')
      .send({ email: u.email, password: u.password })
      .expect(200)
    expect(ok.body.user).toMatchObject({ id: u.id, email: u.email })
    expect(ok.body.user.passwordHash).toBeUndefined()
    expect(sessionCookie(ok.headers['set-cookie'])).not.toBeNull()

    const wrong = await request(app)
      .post('/api/auth/sign-in')
      .send({ email: u.email, password: 'not the password' })
    const unknown = await request(app)
      .post('/api/auth/sign-in')
      .send({ email: email(), password: 'not the password' })
    expect(wrong.status).toBe(400)
    expect(unknown.status).toBe(400)
    expect(wrong.body).toEqual(unknown.body)
    expect(wrong.body.error).toEqual({
      code: 'bad_credentials',
      message: 'That e-mail and password do not match an account.',
    })
    expect(sessionCookie(wrong.headers['set-cookie'])).toBeNull()
  })

  it('does not let an unverified account in, and mails a fresh link', async () => {
    const u = await createUser(ctx, { verified: false })
    const before = await mailCount(ctx, u.email)
    const res = await request(app)
      .post('/api/auth/sign-in')
      .send({ email: u.email, password: u.password })
      .expect(403)
    expect(res.body.error.code).toBe('email_unverified')
    expect(await mailCount(ctx, u.email)).toBe(before + 1)
  })

  it('signs out this device only, or every device', async () => {
    const u = await createUser(ctx)
    const s2 = await request(app).post('/api/auth/sign-in').send({ email: u.email, password: u.password })
    const second = sessionCookie(s2.headers['set-cookie'])!
    const out = await request(app).post('/api/auth/sign-out').set('cookie', u.cookie).expect(204)
    expect(String(out.headers['set-cookie'])).toMatch(/ohmward_session=;/)
    expect((await request(app).get('/api/auth/me').set('cookie', u.cookie)).body.user).toBeNull()
    expect((await request(app).get('/api/auth/me').set('cookie', second)).body.user.id).toBe(u.id)

    const third = sessionCookie(
      (await request(app).post('/api/auth/sign-in').send({ email: u.email, password: u.password })).headers[
        'set-cookie'
      ],
    )!
    await request(app).post('/api/auth/sign-out-everywhere').set('cookie', second).expect(204)
    expect((await request(app).get('/api/auth/me').set('cookie', third)).body.user).toBeNull()
    expect(await ctx.db.select().from(sessions).where(eq(sessions.userId, u.id))).toHaveLength(0)
  })

  it('sets a Secure cookie when the request came over HTTPS (through the local proxy)', async () => {
    const u = await createUser(ctx)
    const res = await request(app)
      .post('/api/auth/sign-in')
      .set('x-forwarded-proto', 'https')
      .send({ email: u.email, password: u.password })
      .expect(200)
    expect(String(res.headers['set-cookie'])).toMatch(/; Secure/i)
  })
})

describe('sessions', () => {
  it('treats an expired session as signed out (401 on a protected route) and clears the cookie', async () => {
    const u = await createUser(ctx)
    await ctx.db
      .update(sessions)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(sessions.userId, u.id))
    const res = await request(app).get('/api/account').set('cookie', u.cookie).expect(401)
    expect(res.body.error.code).toBe('unauthorized')
    expect(String(res.headers['set-cookie'])).toMatch(/ohmward_session=;/)
  })

  it('extends a session used in the second half of its life', async () => {
    const u = await createUser(ctx)
    const soon = new Date(Date.now() + 5 * 24 * 3600_000)
    await ctx.db.update(sessions).set({ expiresAt: soon }).where(eq(sessions.userId, u.id))
    const res = await request(app).get('/api/account').set('cookie', u.cookie).expect(200)
    expect(sessionCookie(res.headers['set-cookie'])).not.toBeNull()
    const [s] = await ctx.db.select().from(sessions).where(eq(sessions.userId, u.id))
    expect(s!.expiresAt.getTime()).toBeGreaterThan(Date.now() + 29 * 24 * 3600_000)
  })

  it('answers 401 to a signed-out call', async () => {
    const res = await request(app).patch('/api/account/profile').send({ displayName: 'X' }).expect(401)
    expect(res.body.error).toEqual({ code: 'unauthorized', message: 'Please sign in first.' })
  })
})

describe('forgotten password', () => {
  it('answers the same for an unknown address and mails nothing', async () => {
    const u = await createUser(ctx)
    const addr = email()
    const a = await request(app).post('/api/auth/forgot-password').send({ email: u.email }).expect(202)
    const b = await request(app).post('/api/auth/forgot-password').send({ email: addr }).expect(202)
    expect(a.body).toEqual(b.body)
    expect(await mailCount(ctx, addr)).toBe(0)
    expect((await lastMail(ctx, u.email, 'reset_password'))?.subject).toBe('Choose a new Ohmward password')
  })

  it('resets with the mailed link once, ends every session, and the new password works', async () => {
    const u = await createUser(ctx)
    await request(app).post('/api/auth/forgot-password').send({ email: u.email }).expect(202)
    const token = tokenFrom((await lastMail(ctx, u.email, 'reset_password'))!.textBody)

    const weak = await request(app)
      .post('/api/auth/reset-password')
      .send({ token, password: 'short' })
      .expect(400)
    expect(weak.body.error.fields.password[0]).toMatch(/at least 10/)

    const newPassword = 'a brand new passphrase'
    await request(app).post('/api/auth/reset-password').send({ token, password: newPassword }).expect(200)
    expect((await request(app).get('/api/auth/me').set('cookie', u.cookie)).body.user).toBeNull()
    await request(app).post('/api/auth/sign-in').send({ email: u.email, password: u.password }).expect(400)
    await request(app).post('/api/auth/sign-in').send({ email: u.email, password: newPassword }).expect(200)

    const reused = await request(app)
      .post('/api/auth/reset-password')
      .send({ token, password: 'yet another passphrase' })
      .expect(400)
    expect(reused.body.error.code).toBe('invalid_token')
  })

  it('refuses an expired reset link, and a link replaced by a newer one', async () => {
    const u = await createUser(ctx)
    await request(app).post('/api/auth/forgot-password').send({ email: u.email })
    const first = tokenFrom((await lastMail(ctx, u.email, 'reset_password'))!.textBody)
    // An hour is the limit: the stored expiry is about one hour after issue.
    const [row] = await ctx.db
      .select()
      .from(authTokens)
      .where(eq(authTokens.tokenHash, hashToken(first)))
    const lifeMs = row!.expiresAt.getTime() - row!.createdAt.getTime()
    expect(Math.abs(lifeMs - 3600_000)).toBeLessThan(60_000)
    await ctx.db
      .update(authTokens)
      .set({ expiresAt: sql`now() - interval '1 second'` })
      .where(eq(authTokens.tokenHash, hashToken(first)))
    const expired = await request(app)
      .post('/api/auth/reset-password')
      .send({ token: first, password: 'a brand new passphrase' })
      .expect(400)
    expect(expired.body.error.code).toBe('invalid_token')

    await request(app).post('/api/auth/forgot-password').send({ email: u.email })
    const second = tokenFrom((await lastMail(ctx, u.email, 'reset_password'))!.textBody)
    await request(app).post('/api/auth/forgot-password').send({ email: u.email })
    const third = tokenFrom((await lastMail(ctx, u.email, 'reset_password'))!.textBody)
    await request(app)
      .post('/api/auth/reset-password')
      .send({ token: second, password: 'a brand new passphrase' })
      .expect(400)
    await request(app)
      .post('/api/auth/reset-password')
      .send({ token: third, password: 'a brand new passphrase' })
      .expect(200)
  })
})

describe('account: profile, password, e-mail', () => {
  it('updates display name and preferences, and refuses a stale version', async () => {
    const u = await createUser(ctx)
    const me = (await request(app).get('/api/account').set('cookie', u.cookie).expect(200)).body.user
    expect(me).toMatchObject({ unitSystem: 'metric', temperatureUnit: 'C', currency: 'EUR' })
    const res = await request(app)
      .patch('/api/account/profile')
      .set('cookie', u.cookie)
      .send({
        displayName: 'Ines L.',
        unitSystem: 'imperial',
        temperatureUnit: 'F',
        currency: 'USD',
        version: me.version,
      })
      .expect(200)
    expect(res.body.user).toMatchObject({
      displayName: 'Ines L.',
      unitSystem: 'imperial',
      temperatureUnit: 'F',
      currency: 'USD',
    })
    expect(res.body.user.version).toBe(me.version + 1)
    const stale = await request(app)
      .patch('/api/account/profile')
      .set('cookie', u.cookie)
      .send({ currency: 'GBP', version: me.version })
      .expect(409)
    expect(stale.body.error.code).toBe('conflict')
    expect(stale.body.error.current.currency).toBe('USD')
    const bad = await request(app)
      .patch('/api/account/profile')
      .set('cookie', u.cookie)
      .send({ unitSystem: 'cubits', currency: 'XXX' })
      .expect(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['currency', 'unitSystem'])
  })

  it('changes the password with the current one, keeping this device and ending the others', async () => {
    const u = await createUser(ctx)
    const other = sessionCookie(
      (await request(app).post('/api/auth/sign-in').send({ email: u.email, password: u.password })).headers[
        'set-cookie'
      ],
    )!
    const wrong = await request(app)
      .post('/api/account/password')
      .set('cookie', u.cookie)
      .send({ currentPassword: 'nope nope nope', newPassword: 'another fine passphrase' })
      .expect(400)
    expect(wrong.body.error.fields.currentPassword[0]).toMatch(/not your current password/)
    const ok = await request(app)
      .post('/api/account/password')
      .set('cookie', u.cookie)
      .send({ currentPassword: u.password, newPassword: 'another fine passphrase' })
      .expect(200)
    const fresh = sessionCookie(ok.headers['set-cookie'])!
    expect((await request(app).get('/api/auth/me').set('cookie', fresh)).body.user.id).toBe(u.id)
    expect((await request(app).get('/api/auth/me').set('cookie', other)).body.user).toBeNull()
    expect(await lastMail(ctx, u.email, 'password_changed')).not.toBeNull()
  })

  it('changes the e-mail only after the new address confirms it', async () => {
    const { email: oldAddr, cookie } = await signUpVerified()
    const newAddr = email()
    await request(app)
      .post('/api/account/email')
      .set('cookie', cookie)
      .send({ newEmail: newAddr, password: PASSWORD })
      .expect(202)
    expect((await request(app).get('/api/account').set('cookie', cookie)).body.user.email).toBe(oldAddr)
    expect(await lastMail(ctx, oldAddr, 'email_change_notice')).not.toBeNull()
    const token = tokenFrom((await lastMail(ctx, newAddr, 'change_email'))!.textBody)
    const res = await request(app).post('/api/auth/confirm-email-change').send({ token }).expect(200)
    expect(res.body.user).toMatchObject({ email: newAddr, emailVerified: true })
    await request(app).post('/api/auth/sign-in').send({ email: newAddr, password: PASSWORD }).expect(200)
    await request(app).post('/api/auth/sign-in').send({ email: oldAddr, password: PASSWORD }).expect(400)
    await request(app).post('/api/auth/confirm-email-change').send({ token }).expect(400)
  })

  it('answers an e-mail change to a taken address like any other, without a confirm link', async () => {
    const a = await createUser(ctx)
    const b = await createUser(ctx)
    const res = await request(app)
      .post('/api/account/email')
      .set('cookie', a.cookie)
      .send({ newEmail: b.email, password: a.password })
      .expect(202)
    expect(res.body.message).toMatch(/We sent a link/)
    expect(await lastMail(ctx, b.email, 'change_email')).toBeNull()
    expect(await lastMail(ctx, b.email, 'address_taken')).not.toBeNull()
    const wrongPw = await request(app)
      .post('/api/account/email')
      .set('cookie', a.cookie)
      .send({ newEmail: email(), password: 'wrong wrong' })
      .expect(400)
    expect(wrongPw.body.error.fields.password).toBeDefined()
  })
})
