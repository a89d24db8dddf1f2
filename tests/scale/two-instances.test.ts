import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import { startDatabase, startServerProcess, type Stack, type ServerProcess } from '../../scripts/lib/harness'
import { startMailFake, type MailFake } from '../../scripts/fakes/mail'
import { freePort } from '../../scripts/lib/pg'

/**
 * Scale-out: the server keeps no state of its own. Two server processes on different ports share one PostgreSQL
 * (their own throwaway cluster here): sessions, rate limits and the mail outbox live in the database.
 */
describe('two server instances on one database', () => {
  let stack: Stack
  let a: ServerProcess
  let b: ServerProcess
  let mail: MailFake
  const LIMIT = 6

  beforeAll(async () => {
    stack = await startDatabase({ seed: true })
    mail = await startMailFake({ smtpPort: await freePort(), apiPort: await freePort() })
    const env = {
      SMTP_PORT: String(mail.smtpPort),
      AUTH_RATE_LIMIT_MAX: String(LIMIT),
      AUTH_RATE_LIMIT_WINDOW_SECONDS: '600',
      MAIL_POLL_MS: '200',
    }
    ;[a, b] = await Promise.all([startServerProcess(stack.dbUrl, env), startServerProcess(stack.dbUrl, env)])
  }, 240_000)

  afterAll(async () => {
    await Promise.all([a?.stop(), b?.stop()])
    await mail?.close()
    await stack?.stop()
  })

  const post = (server: ServerProcess, path: string, body: unknown) =>
    fetch(server.url + path, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(body),
    })

  it('a session made on one instance works on the other', async () => {
    const res = await post(a, '/api/auth/sign-in', {
      email: 'ines@demo.ohmward.local',
      password: 'van-life-demo-1',
    })
    expect(res.status).toBe(200)
    const cookie = (res.headers.get('set-cookie') ?? '').split(';')[0]!
    const me = await fetch(b.url + '/api/auth/me', { headers: { cookie } })
    expect(me.status).toBe(200)
    expect(JSON.stringify(await me.json())).toContain('ines@demo.ohmward.local')
  })

  it('the sign-in rate limit counts attempts on both instances together', async () => {
    // The previous test's sign-in succeeded, which does not count; alternate instances until the shared
    // counter of failed attempts trips.
    const statuses: number[] = []
    for (let i = 0; i < LIMIT + 3; i++) {
      const server = i % 2 === 0 ? b : a
      const res = await post(server, '/api/auth/sign-in', {
        email: 'ines@demo.ohmward.local',
        password: 'wrong-password-1',
      })
      statuses.push(res.status)
    }
    const allowed = statuses.filter((s) => s !== 429).length
    expect(allowed).toBe(LIMIT)
    expect(statuses.slice(LIMIT)).toEqual([429, 429, 429])
  })

  it('a queued mail is sent exactly once although both instances drain the outbox', async () => {
    mail.messages.length = 0
    const res = await post(a, '/api/auth/forgot-password', { email: 'tomas@demo.ohmward.local' })
    expect(res.status).toBeLessThan(300)
    const deadline = Date.now() + 20_000
    while (Date.now() < deadline && !mail.messages.some((m) => m.to.includes('tomas@demo.ohmward.local'))) {
      await new Promise((r) => setTimeout(r, 200))
    }
    // Give the other instance several poll rounds to (wrongly) send it again.
    await new Promise((r) => setTimeout(r, 2_000))
    expect(mail.messages.filter((m) => m.to.includes('tomas@demo.ohmward.local'))).toHaveLength(1)
  })
})
