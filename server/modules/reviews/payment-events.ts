import { eq } from 'drizzle-orm'
import type Stripe from 'stripe'
import { Decimal } from 'decimal.js'
import type { AppContext } from '../../context'
import type { Db } from '../../db/client'
import { reviewPayments, reviews, users, vehicles } from '../../db/schema/index'
import { enqueueMail } from '../../services/mail'
import type { Tx } from '../crew/access'
import { appUrl } from '../crew/service'
import { addEvent } from './service'
import { reviewMails } from './mails'

/**
 * What each payment event does to a review. Runs inside the webhook's transaction, after the event id was
 * recorded as processed, so a replayed event never gets here twice. Unknown sessions and event types are
 * recorded and otherwise ignored.
 */
export async function applyPaymentEvent(ctx: AppContext, tx: Tx, event: Stripe.Event): Promise<string> {
  switch (event.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const s = event.data.object
      if (s.payment_status !== 'paid') return 'not paid yet'
      return paid(
        ctx,
        tx,
        s.id,
        typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null),
      )
    }
    case 'checkout.session.async_payment_failed':
    case 'checkout.session.expired':
      return failed(ctx, tx, event.data.object.id)
    case 'charge.refunded': {
      const ch = event.data.object
      const pi = typeof ch.payment_intent === 'string' ? ch.payment_intent : (ch.payment_intent?.id ?? null)
      if (!pi || !ch.refunded) return 'partial or unknown refund ignored'
      return refunded(ctx, tx, pi)
    }
    default:
      return 'ignored'
  }
}

async function context(ctx: AppContext, tx: Tx, r: typeof reviews.$inferSelect) {
  const [v] = await tx.select({ name: vehicles.name }).from(vehicles).where(eq(vehicles.id, r.vehicleId))
  const [client] = r.requesterId ? await tx.select().from(users).where(eq(users.id, r.requesterId)) : []
  const [advisor] = await tx.select().from(users).where(eq(users.id, r.advisorId))
  const base = { vehicle: v?.name ?? '', scenario: r.scenarioName, link: `${appUrl(ctx)}/reviews/${r.id}` }
  return {
    client: client ? { ...base, to: client.email, name: client.displayName } : null,
    advisor: advisor ? { ...base, to: advisor.email, name: advisor.displayName } : null,
    clientName: client?.displayName ?? 'The client',
    advisorName: advisor?.displayName ?? 'The advisor',
  }
}

async function paymentBySession(tx: Tx, sessionId: string) {
  const [p] = await tx
    .select()
    .from(reviewPayments)
    .where(eq(reviewPayments.checkoutSessionId, sessionId))
    .for('update')
  if (!p) return null
  const [r] = await tx.select().from(reviews).where(eq(reviews.id, p.reviewId)).for('update')
  return r ? { p, r } : null
}

async function paid(ctx: AppContext, tx: Tx, sessionId: string, intentId: string | null): Promise<string> {
  const hit = await paymentBySession(tx, sessionId)
  if (!hit) return 'unknown session'
  const { p, r } = hit
  if (p.status === 'paid' || p.status === 'refund_pending' || p.status === 'refunded') return 'already paid'
  const now = new Date()
  await tx
    .update(reviewPayments)
    .set({ status: 'paid', paymentIntentId: intentId, updatedAt: now })
    .where(eq(reviewPayments.id, p.id))
  if (r.state !== 'awaiting_payment') return 'paid, review no longer waiting'
  await tx
    .update(reviews)
    .set({ state: 'requested', paymentState: 'paid', paidAt: now, updatedAt: now, version: r.version + 1 })
    .where(eq(reviews.id, r.id))
  await addEvent(
    tx,
    r.id,
    `Payment of ${new Decimal(r.feeAmount).toFixed(2)} ${r.currency} received. The review is open for ${(await context(ctx, tx, r)).advisorName}.`,
  )
  const m = await context(ctx, tx, r)
  const db = tx as unknown as Db
  if (m.advisor) await enqueueMail(db, reviewMails.newRequest(m.advisor, m.clientName, r.message))
  if (m.client) await enqueueMail(db, reviewMails.paid(m.client, m.advisorName))
  return 'opened'
}

async function failed(ctx: AppContext, tx: Tx, sessionId: string): Promise<string> {
  const hit = await paymentBySession(tx, sessionId)
  if (!hit) return 'unknown session'
  const { p, r } = hit
  if (p.status !== 'pending') return 'already settled'
  const now = new Date()
  await tx.update(reviewPayments).set({ status: 'failed', updatedAt: now }).where(eq(reviewPayments.id, p.id))
  if (r.state !== 'awaiting_payment') return 'review no longer waiting'
  await tx
    .update(reviews)
    .set({ paymentState: 'failed', updatedAt: now, version: r.version + 1 })
    .where(eq(reviews.id, r.id))
  await addEvent(tx, r.id, 'The payment did not go through. Nothing was charged; you can try again.')
  const m = await context(ctx, tx, r)
  if (m.client) await enqueueMail(tx as unknown as Db, reviewMails.paymentFailed(m.client))
  return 'failed'
}

async function refunded(ctx: AppContext, tx: Tx, intentId: string): Promise<string> {
  const [p] = await tx
    .select()
    .from(reviewPayments)
    .where(eq(reviewPayments.paymentIntentId, intentId))
    .for('update')
  if (!p) return 'unknown payment'
  if (p.status === 'refunded') return 'already refunded'
  const now = new Date()
  await tx
    .update(reviewPayments)
    .set({ status: 'refunded', updatedAt: now })
    .where(eq(reviewPayments.id, p.id))
  const [r] = await tx.select().from(reviews).where(eq(reviews.id, p.reviewId)).for('update')
  if (!r) return 'refunded'
  await tx
    .update(reviews)
    .set({ paymentState: 'refunded', updatedAt: now, version: r.version + 1 })
    .where(eq(reviews.id, r.id))
  const amount = `${new Decimal(r.feeAmount).toFixed(2)} ${r.currency}`
  await addEvent(tx, r.id, `The fee of ${amount} was refunded in full.`)
  const m = await context(ctx, tx, r)
  if (m.client) await enqueueMail(tx as unknown as Db, reviewMails.refunded(m.client, amount))
  return 'refunded'
}
