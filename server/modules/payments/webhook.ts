import express, { Router } from 'express'
import type Stripe from 'stripe'
import type { AppContext } from '../../context'
import { processedPaymentEvents } from '../../db/schema/index'
import { HttpError } from '../../errors'
import { stripeClient } from './stripe'
import { applyPaymentEvent } from '../reviews/payment-events'

/**
 * POST /api/webhooks/payments: events from the payment provider. The raw body is verified with the SDK
 * (`webhooks.constructEvent`, the provider's HMAC-SHA256 signature and its 5-minute tolerance); then, in one
 * transaction, the event id is recorded and the event applied. An id seen before changes nothing and is
 * answered 200 so the provider stops retrying.
 */
export function paymentsWebhookRouter(ctx: AppContext): Router {
  const r = Router()
  r.post('/payments', express.raw({ type: 'application/json', limit: '1mb' }), async (req, res) => {
    const signature = req.get('stripe-signature')
    const raw = req.body
    if (!signature || !Buffer.isBuffer(raw)) {
      throw new HttpError(400, 'bad_signature', 'The webhook has no valid signature.')
    }
    const stripe = await stripeClient(ctx.env)
    let event: Stripe.Event
    try {
      event = stripe.webhooks.constructEvent(raw, signature, ctx.env.STRIPE_WEBHOOK_SECRET)
    } catch {
      req.log?.warn('payment webhook with a bad signature refused')
      throw new HttpError(400, 'bad_signature', 'The webhook signature does not match.')
    }
    const outcome = await ctx.db.transaction(async (tx) => {
      const obj = event.data.object as { id?: string }
      const inserted = await tx
        .insert(processedPaymentEvents)
        .values({ eventId: event.id, type: event.type, objectId: obj.id ?? null })
        .onConflictDoNothing()
        .returning({ id: processedPaymentEvents.eventId })
      if (!inserted.length) return 'duplicate'
      return applyPaymentEvent(ctx, tx, event)
    })
    req.log?.info({ eventId: event.id, type: event.type, outcome }, 'payment webhook')
    res.json({ received: true, duplicate: outcome === 'duplicate', outcome })
  })
  return r
}
