import type { Transporter } from 'nodemailer'
import type { AppContext } from '../context'
import { createMailTransport } from './mail'
import { pruneRateLimits } from '../auth/rate-limit-store'

interface ClaimedMail {
  id: number
  to_address: string
  subject: string
  text_body: string
  attempts: number
}

/** Seconds to wait before attempt n+1: base · 2^(n−1), at most one hour. */
export function retryDelaySeconds(attempts: number, baseSeconds: number): number {
  return Math.min(baseSeconds * 2 ** Math.max(0, attempts - 1), 3600)
}

/**
 * Claim up to `batch` due mails. FOR UPDATE SKIP LOCKED lets several server processes drain one outbox:
 * each row is claimed by exactly one of them, which holds a lease (locked_until) while it sends.
 * A process that dies mid-send leaves the lease to run out, and the mail becomes due again.
 */
async function claim(ctx: AppContext, batch: number): Promise<ClaimedMail[]> {
  const r = await ctx.pool.query<ClaimedMail>(
    `UPDATE mail_outbox SET locked_until = now() + interval '2 minutes', attempts = attempts + 1
     WHERE id IN (
       SELECT id FROM mail_outbox
       WHERE status = 'queued' AND next_attempt_at <= now() AND (locked_until IS NULL OR locked_until < now())
       ORDER BY id LIMIT $1
       FOR UPDATE SKIP LOCKED)
     RETURNING id, to_address, subject, text_body, attempts`,
    [batch],
  )
  return r.rows
}

/** Send every mail that is due now, once. Returns how many were sent and how many failed this round. */
export async function drainOutboxOnce(
  ctx: AppContext,
  transport: Transporter,
  batch = 20,
): Promise<{ sent: number; failed: number }> {
  let sent = 0
  let failed = 0
  for (;;) {
    const mails = await claim(ctx, batch)
    if (mails.length === 0) break
    for (const m of mails) {
      try {
        await transport.sendMail({
          from: ctx.env.MAIL_FROM,
          to: m.to_address,
          subject: m.subject,
          text: m.text_body,
        })
        await ctx.pool.query(
          "UPDATE mail_outbox SET status = 'sent', sent_at = now(), locked_until = NULL, last_error = NULL WHERE id = $1",
          [m.id],
        )
        sent++
      } catch (err) {
        failed++
        const giveUp = m.attempts >= ctx.env.MAIL_MAX_ATTEMPTS
        const delayS = retryDelaySeconds(m.attempts, ctx.env.MAIL_RETRY_BASE_SECONDS)
        await ctx.pool.query(
          `UPDATE mail_outbox SET locked_until = NULL, last_error = $2,
             status = CASE WHEN $3::boolean THEN 'failed'::mail_status ELSE status END,
             next_attempt_at = now() + make_interval(secs => $4::double precision)
           WHERE id = $1`,
          [m.id, String((err as Error).message ?? err).slice(0, 500), giveUp, delayS],
        )
        ctx.log.warn(
          { mailId: m.id, attempts: m.attempts, giveUp, err: (err as Error).message },
          'mail not sent',
        )
      }
    }
    if (failed > 0) break // the server is likely down: wait for the next round
  }
  return { sent, failed }
}

/** The background loop: drain the outbox every MAIL_POLL_MS; stop() waits for the round in progress. */
export function startOutboxWorker(ctx: AppContext): { stop(): Promise<void> } {
  const transport = createMailTransport(ctx.env)
  let stopped = false
  let timer: NodeJS.Timeout | null = null
  let current: Promise<unknown> = Promise.resolve()
  let rounds = 0
  const tick = () => {
    if (stopped) return
    current = (async () => {
      try {
        await drainOutboxOnce(ctx, transport)
        if (++rounds % 600 === 0) await pruneRateLimits(ctx.pool)
      } catch (err) {
        ctx.log.warn({ err: (err as Error).message }, 'outbox round failed')
      }
    })().finally(() => {
      if (!stopped) timer = setTimeout(tick, ctx.env.MAIL_POLL_MS)
    })
  }
  timer = setTimeout(tick, 50)
  return {
    async stop() {
      stopped = true
      if (timer) clearTimeout(timer)
      await current
      transport.close()
    },
  }
}
