import { index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { reviews } from './reviews'

const tsz = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' })

export const paymentStatus = pgEnum('payment_status', [
  'pending',
  'paid',
  'failed',
  'refund_pending',
  'refunded',
])

/**
 * One hosted checkout per attempt to pay a review (issue 8). Amounts in the currency's minor units, as the
 * payment provider takes them; the review keeps the decimal fee.
 */
export const reviewPayments = pgTable(
  'review_payments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    reviewId: uuid('review_id')
      .notNull()
      .references(() => reviews.id, { onDelete: 'cascade' }),
    checkoutSessionId: text('checkout_session_id').notNull(),
    paymentIntentId: text('payment_intent_id'),
    refundId: text('refund_id'),
    amountMinor: integer('amount_minor').notNull(),
    currency: text('currency').notNull(),
    status: paymentStatus('status').notNull().default('pending'),
    createdAt: tsz('created_at').notNull().defaultNow(),
    updatedAt: tsz('updated_at').notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('review_payments_session_key').on(t.checkoutSessionId),
    index('review_payments_review_idx').on(t.reviewId),
    index('review_payments_intent_idx').on(t.paymentIntentId),
  ],
)

/**
 * Every webhook event the server has handled, by the provider's event id. Inserted in the same transaction
 * as the change the event causes, so each event takes effect exactly once however often it is delivered.
 */
export const processedPaymentEvents = pgTable('processed_payment_events', {
  eventId: text('event_id').primaryKey(),
  type: text('type').notNull(),
  objectId: text('object_id'),
  processedAt: tsz('processed_at').notNull().defaultNow(),
})
