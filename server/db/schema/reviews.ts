import {
  boolean,
  index,
  integer,
  jsonb,
  numeric,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core'
import { users } from './auth'
import { vehicles } from './vehicles'
import { scenarios } from './scenarios'

const tsz = (name: string) => timestamp(name, { withTimezone: true, mode: 'date' })

/**
 * Advisor profiles (issue 8): one per advisor account. The review fee is exact decimal money
 * (`numeric`, read back as a string, computed with decimal.js); 0 means the advisor reviews for free.
 */
export const advisorProfiles = pgTable('advisor_profiles', {
  userId: text('user_id')
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  headline: text('headline').notNull().default(''),
  bio: text('bio').notNull().default(''),
  specialities: jsonb('specialities').$type<string[]>().notNull().default([]),
  feeAmount: numeric('fee_amount', { precision: 12, scale: 2 }).notNull().default('0'),
  currency: text('currency').notNull().default('EUR'),
  /** Shown in the directory and open for new requests. */
  accepting: boolean('accepting').notNull().default(true),
  version: integer('version').notNull().default(1),
  createdAt: tsz('created_at').notNull().defaultNow(),
  updatedAt: tsz('updated_at').notNull().defaultNow(),
})

/** Our names for a review's states (DESIGN.md). */
export const reviewState = pgEnum('review_state', [
  'requested',
  'awaiting_payment',
  'in_progress',
  'answered',
  'closed',
])
export const reviewVerdict = pgEnum('review_verdict', ['sound', 'sound_with_changes', 'rethink'])
/** Why a closed review closed. */
export const reviewCloseReason = pgEnum('review_close_reason', ['done', 'cancelled', 'declined'])
export const reviewPaymentState = pgEnum('review_payment_state', [
  'none',
  'unpaid',
  'failed',
  'paid',
  'refund_pending',
  'refunded',
])

export const reviews = pgTable(
  'reviews',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    vehicleId: uuid('vehicle_id')
      .notNull()
      .references(() => vehicles.id, { onDelete: 'cascade' }),
    scenarioId: uuid('scenario_id').references(() => scenarios.id, { onDelete: 'set null' }),
    /** The scenario's name when asked, kept if the scenario is deleted later. */
    scenarioName: text('scenario_name').notNull(),
    requesterId: text('requester_id').references(() => users.id, { onDelete: 'set null' }),
    advisorId: text('advisor_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    message: text('message').notNull(),
    state: reviewState('state').notNull(),
    feeAmount: numeric('fee_amount', { precision: 12, scale: 2 }).notNull().default('0'),
    currency: text('currency').notNull().default('EUR'),
    paymentState: reviewPaymentState('payment_state').notNull().default('none'),
    verdict: reviewVerdict('verdict'),
    summary: text('summary'),
    closeReason: reviewCloseReason('close_reason'),
    paidAt: tsz('paid_at'),
    startedAt: tsz('started_at'),
    answeredAt: tsz('answered_at'),
    closedAt: tsz('closed_at'),
    version: integer('version').notNull().default(1),
    createdAt: tsz('created_at').notNull().defaultNow(),
    updatedAt: tsz('updated_at').notNull().defaultNow(),
  },
  (t) => [
    index('reviews_vehicle_idx').on(t.vehicleId),
    index('reviews_advisor_idx').on(t.advisorId, t.state),
    index('reviews_requester_idx').on(t.requesterId),
  ],
)

/** What a comment is pinned to. `result` items are named results of the scenario's outlook. */
export const reviewPinKind = pgEnum('review_pin_kind', [
  'general',
  'appliance',
  'source',
  'battery',
  'result',
])

/** The thread: comments by either side, and event lines ("Payment received") written by the server. */
export const reviewComments = pgTable(
  'review_comments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    reviewId: uuid('review_id')
      .notNull()
      .references(() => reviews.id, { onDelete: 'cascade' }),
    /** null for event lines and for deleted accounts. */
    authorId: text('author_id').references(() => users.id, { onDelete: 'set null' }),
    kind: text('kind').notNull().default('comment'),
    body: text('body').notNull(),
    pinKind: reviewPinKind('pin_kind').notNull().default('general'),
    pinItemId: text('pin_item_id'),
    /** The item's name when pinned ("Fridge"), kept if it is renamed or removed. */
    pinLabel: text('pin_label'),
    createdAt: tsz('created_at').notNull().defaultNow(),
  },
  (t) => [index('review_comments_review_idx').on(t.reviewId, t.createdAt)],
)

/** When each person last opened a review: the inbox's unread counts. */
export const reviewReads = pgTable(
  'review_reads',
  {
    reviewId: uuid('review_id')
      .notNull()
      .references(() => reviews.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    lastReadAt: tsz('last_read_at').notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.reviewId, t.userId] })],
)
