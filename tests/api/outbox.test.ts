import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import pg from 'pg'
import request from 'supertest'
import { eq } from 'drizzle-orm'
import { createApp } from '../../server/app'
import { runMigrations } from '../../scripts/lib/migrate'
import { freePort } from '../../scripts/lib/pg'
import { startMailFake, type MailFake } from '../../scripts/fakes/mail'
import { testContext } from '../support/context'
import { createUser } from '../support/factories'
import { mailOutbox } from '../../server/db/schema/index'
import { createMailTransport, enqueueMail } from '../../server/services/mail'
import { drainOutboxOnce, retryDelaySeconds, startOutboxWorker } from '../../server/services/mail-worker'
import type { AppContext } from '../../server/context'

/**
 * The outbox runs against a database of its own and a fake SMTP server of its own, so the workers of other
 * test files (which share the main test database) cannot take these mails.
 */
describe('mail outbox', () => {
  const adminUrl = process.env.PG_ADMIN_URL ?? ''
  const name = `t_outbox_${process.pid}_${Date.now().toString(36)}`
  let admin: pg.Client
  let ctx: AppContext
  let fake: MailFake
  let smtpPort: number

  beforeAll(async () => {
    if (!adminUrl) throw new Error('PG_ADMIN_URL is set by npm test')
    admin = new pg.Client({ connectionString: adminUrl })
    await admin.connect()
    await admin.query(`CREATE DATABASE ${name}`)
    const url = adminUrl.replace(/\/postgres$/, `/${name}`)
    await runMigrations(url)
    smtpPort = await freePort()
    fake = await startMailFake({ smtpPort, apiPort: 0 })
    await fake.stopSmtp() // the mail server starts "down"
    ctx = testContext({
      DATABASE_URL: url,
      SMTP_PORT: String(smtpPort),
      MAIL_RETRY_BASE_SECONDS: '0.2',
      MAIL_POLL_MS: '100',
    })
  })
  afterAll(async () => {
    await ctx?.pool.end()
    await fake?.close()
    await admin?.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`)
    await admin?.end()
  })

  it('keeps a reset mail while the mail server is down and sends it once it is back', async () => {
    const app = createApp(ctx)
    const u = await createUser(ctx)
    await request(app).post('/api/auth/forgot-password').send({ email: u.email }).expect(202)

    const transport = createMailTransport(ctx.env)
    const down = await drainOutboxOnce(ctx, transport)
    expect(down).toEqual({ sent: 0, failed: 1 })
    const [kept] = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, u.email))
    expect(kept).toMatchObject({ status: 'queued', attempts: 1, kind: 'reset_password' })
    expect(kept!.lastError).toBeTruthy()
    expect(kept!.nextAttemptAt.getTime()).toBeGreaterThan(Date.now() - 1000)
    expect(fake.messages).toHaveLength(0)

    await fake.startSmtp()
    // The background worker picks it up when the retry is due.
    const worker = startOutboxWorker(ctx)
    const deadline = Date.now() + 10_000
    while (fake.messages.length === 0 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100))
    await new Promise((r) => setTimeout(r, 400)) // a few more rounds: nothing is sent twice
    await worker.stop()
    transport.close()

    expect(fake.messages).toHaveLength(1)
    expect(fake.messages[0]).toMatchObject({ to: [u.email], subject: 'Choose a new Ohmward password' })
    expect(fake.messages[0]!.text).toMatch(/\/reset-password\?token=[a-z2-7]+/)
    const [sent] = await ctx.db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, u.email))
    expect(sent).toMatchObject({ status: 'sent', attempts: 2, lastError: null })
    expect(sent!.sentAt).toBeInstanceOf(Date)
  })

  it('sends each mail exactly once when several workers (server processes) drain one outbox', async () => {
    fake.messages.splice(0)
    const tag = Date.now().toString(36)
    const ids: number[] = []
    for (let i = 0; i < 30; i++) {
      ids.push(
        await enqueueMail(ctx.db, {
          to: `w${i}-${tag}@test.ohmward.local`,
          subject: `n${i}`,
          text: 'hi',
          kind: 'test',
        }),
      )
    }
    // Three "processes": each its own pool and SMTP transport, draining at the same moment.
    const others = [0, 1, 2].map(() => testContext({ ...ctxOverrides(ctx), MAIL_POLL_MS: '20' }))
    const results = await Promise.all(others.map((c) => drainOutboxOnce(c, createMailTransport(c.env), 4)))
    await Promise.all(others.map((c) => c.pool.end()))
    expect(results.reduce((s, r) => s + r.sent, 0)).toBe(30)
    const got = fake.messages.filter((m) => m.to[0]!.endsWith(`-${tag}@test.ohmward.local`))
    expect(got).toHaveLength(30)
    expect(new Set(got.map((m) => m.to[0])).size).toBe(30)
  })

  it('backs off exponentially, capped at an hour', () => {
    expect([1, 2, 3, 4].map((n) => retryDelaySeconds(n, 30))).toEqual([30, 60, 120, 240])
    expect(retryDelaySeconds(20, 30)).toBe(3600)
  })
})

function ctxOverrides(ctx: AppContext): Record<string, string> {
  return { DATABASE_URL: ctx.env.DATABASE_URL, SMTP_PORT: String(ctx.env.SMTP_PORT) }
}
