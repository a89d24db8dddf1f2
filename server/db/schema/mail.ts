import { pgTable, bigserial, text, timestamp, integer, pgEnum, index } from 'drizzle-orm/pg-core'

export const mailStatus = pgEnum('mail_status', ['queued', 'sent', 'failed'])

/**
 * The durable mail outbox. A request inserts a row; the outbox worker (server/services/mail-worker.ts) claims
 * due rows with FOR UPDATE SKIP LOCKED, sends them over SMTP and marks them sent, or schedules a retry.
 * `lockedUntil` is the claim lease, so a crashed worker's rows become due again.
 */
export const mailOutbox = pgTable(
  'mail_outbox',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    toAddress: text('to_address').notNull(),
    subject: text('subject').notNull(),
    textBody: text('text_body').notNull(),
    /** What the mail is for (verify_email, reset_password, …), for logs and tests. */
    kind: text('kind').notNull(),
    status: mailStatus('status').notNull().default('queued'),
    attempts: integer('attempts').notNull().default(0),
    nextAttemptAt: timestamp('next_attempt_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
    lockedUntil: timestamp('locked_until', { withTimezone: true, mode: 'date' }),
    lastError: text('last_error'),
    createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true, mode: 'date' }),
  },
  (t) => [index('mail_outbox_due_idx').on(t.status, t.nextAttemptAt)],
)
