import { and, asc, desc, eq, inArray, or, sql } from 'drizzle-orm'
import { Decimal } from 'decimal.js'
import type { AppContext } from '../../context'
import type { Db } from '../../db/client'
import {
  advisorProfiles,
  appliances,
  batteryBanks,
  chargeSources,
  reviewComments,
  reviewPayments,
  reviewReads,
  reviews,
  scenarios,
  users,
  vehicleMemberships,
  vehicles,
} from '../../db/schema/index'
import { conflict, forbidden, HttpError, notFound, serviceUnavailable, validationFailed } from '../../errors'
import { enqueueMail, type OutgoingMail } from '../../services/mail'
import {
  OPEN_REVIEW_STATES,
  REVIEW_VERDICT_LABEL,
  RESULT_ITEMS,
  type Comment,
  type CommentCreate,
  type PinKind,
  type PlanSnapshot,
  type PinTarget,
  type ReviewAnswer,
  type ReviewCreate,
  type ReviewDetail,
  type ReviewState,
  type ReviewSummary,
} from '../../../shared/schemas/reviews'
import type { CrewRole } from '../../../shared/schemas/crew'
import { memberRole, requireVehicleRole, type Tx } from '../crew/access'
import { appUrl } from '../crew/service'
import { normalizeFee } from '../advisors/service'
import { stripeClient, toMinorUnits } from '../payments/stripe'
import { reviewMails, type ReviewMailContext } from './mails'

type ReviewRow = typeof reviews.$inferSelect
type Side = 'client' | 'advisor'
const asDb = (tx: Tx | Db) => tx as unknown as Db
const CLIENT_WRITERS: readonly CrewRole[] = ['owner', 'editor']

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i
const isOpen = (s: ReviewState) => OPEN_REVIEW_STATES.includes(s)
const money = (amount: string, currency: string) => `${new Decimal(amount).toFixed(2)} ${currency}`

export interface ReviewAccess {
  review: ReviewRow
  side: Side
  /** The user's crew role on the vehicle (null for an advisor who is not on the crew). */
  crewRole: CrewRole | null
  /** May act for the client (pay, cancel, reply, close): owner or editor. */
  clientWriter: boolean
}

/** 401/404 like the vehicle routes: the review's advisor, or a crew member of its vehicle (the client side). */
export async function loadReviewForUser(
  db: Db | Tx,
  reviewId: string,
  userId: string,
  lock = false,
): Promise<ReviewAccess> {
  if (!UUID.test(reviewId)) throw notFound('That review')
  const q = db.select().from(reviews).where(eq(reviews.id, reviewId))
  const [review] = lock ? await q.for('update') : await q
  if (!review) throw notFound('That review')
  const crewRole = await memberRole(db, userId, review.vehicleId)
  if (review.advisorId === userId) return { review, side: 'advisor', crewRole, clientWriter: false }
  if (!crewRole) throw notFound('That review')
  return { review, side: 'client', crewRole, clientWriter: CLIENT_WRITERS.includes(crewRole) }
}

async function names(db: Db | Tx, ids: (string | null)[]) {
  const list = [...new Set(ids.filter((x): x is string => !!x))]
  if (!list.length) return new Map<string, { id: string; displayName: string; email: string }>()
  const rows = await db
    .select({ id: users.id, displayName: users.displayName, email: users.email })
    .from(users)
    .where(inArray(users.id, list))
  return new Map(rows.map((r) => [r.id, r]))
}

async function mailContexts(db: Db | Tx, ctx: AppContext, r: ReviewRow) {
  const [v] = await db.select({ name: vehicles.name }).from(vehicles).where(eq(vehicles.id, r.vehicleId))
  const people = await names(db, [r.requesterId, r.advisorId])
  const link = `${appUrl(ctx)}/reviews/${r.id}`
  const base = { vehicle: v?.name ?? 'your vehicle', scenario: r.scenarioName, link }
  const requester = r.requesterId ? people.get(r.requesterId) : undefined
  const advisor = people.get(r.advisorId)
  const to = (u: { displayName: string; email: string } | undefined): ReviewMailContext | null =>
    u ? { ...base, to: u.email, name: u.displayName } : null
  return {
    client: to(requester),
    advisor: to(advisor),
    clientName: requester?.displayName ?? 'The client',
    advisorName: advisor?.displayName ?? 'The advisor',
  }
}

async function send(tx: Tx | Db, m: OutgoingMail | null | undefined): Promise<void> {
  if (m) await enqueueMail(asDb(tx), m)
}

/** A line in the thread written by the server ("Payment received"). */
export async function addEvent(
  tx: Tx | Db,
  reviewId: string,
  body: string,
  actorId: string | null = null,
): Promise<void> {
  await tx.insert(reviewComments).values({ reviewId, authorId: actorId, kind: 'event', body })
}

async function setState(tx: Tx, id: string, patch: Partial<typeof reviews.$inferInsert>): Promise<ReviewRow> {
  const [row] = await tx
    .update(reviews)
    .set({ ...patch, version: sql`${reviews.version} + 1`, updatedAt: new Date() })
    .where(eq(reviews.id, id))
    .returning()
  return row!
}

// ---------------------------------------------------------------------------------------------------------

export async function createReview(
  ctx: AppContext,
  res: Parameters<typeof requireVehicleRole>[1],
  input: ReviewCreate,
): Promise<ReviewDetail> {
  const userId = res.locals.user!.id
  const [scenario] = await ctx.db.select().from(scenarios).where(eq(scenarios.id, input.scenarioId))
  if (!scenario) throw notFound('That scenario')
  const { role } = await requireVehicleRole(
    ctx.db,
    res,
    scenario.vehicleId,
    ['owner', 'editor', 'viewer', 'advisor'],
    'That scenario',
  )
  if (!CLIENT_WRITERS.includes(role))
    throw forbidden(`Your role on this vehicle (${role}) does not allow asking for reviews.`)
  if (input.advisorId === userId) throw validationFailed({ advisorId: ['must be someone else than you'] })
  const [adv] = await ctx.db
    .select({ p: advisorProfiles, role: users.role })
    .from(advisorProfiles)
    .innerJoin(users, eq(users.id, advisorProfiles.userId))
    .where(eq(advisorProfiles.userId, input.advisorId))
  if (!adv || adv.role !== 'advisor')
    throw validationFailed({ advisorId: ['must be an advisor from the directory'] })
  if (!adv.p.accepting)
    throw validationFailed({ advisorId: ['this advisor is not taking requests at the moment'] })
  const [dup] = await ctx.db
    .select({ id: reviews.id })
    .from(reviews)
    .where(
      and(
        eq(reviews.scenarioId, scenario.id),
        eq(reviews.advisorId, input.advisorId),
        inArray(reviews.state, ['requested', 'awaiting_payment', 'in_progress', 'answered']),
      ),
    )
  if (dup) throw conflict('This advisor already has an open review of this scenario.', { reviewId: dup.id })
  const fee = normalizeFee(adv.p.feeAmount)
  const paid = new Decimal(fee).gt(0)
  const id = await ctx.db.transaction(async (tx) => {
    const [row] = await tx
      .insert(reviews)
      .values({
        vehicleId: scenario.vehicleId,
        scenarioId: scenario.id,
        scenarioName: scenario.name,
        requesterId: userId,
        advisorId: input.advisorId,
        message: input.message,
        state: paid ? 'awaiting_payment' : 'requested',
        feeAmount: fee,
        currency: adv.p.currency,
        paymentState: paid ? 'unpaid' : 'none',
      })
      .returning()
    await addEvent(
      tx,
      row!.id,
      paid
        ? `Review requested; the fee of ${money(fee, adv.p.currency)} is due before it opens.`
        : 'Review requested.',
      userId,
    )
    await tx.insert(reviewReads).values({ reviewId: row!.id, userId }).onConflictDoNothing()
    if (!paid) {
      const m = await mailContexts(tx, ctx, row!)
      await send(tx, m.advisor && reviewMails.newRequest(m.advisor, m.clientName, input.message))
    }
    return row!.id
  })
  return getReview(ctx, id, userId)
}

/** Start a hosted checkout for a review awaiting payment; answers where to send the payer. */
export async function startCheckout(
  ctx: AppContext,
  reviewId: string,
  userId: string,
): Promise<{ url: string }> {
  const a = await loadReviewForUser(ctx.db, reviewId, userId)
  if (a.side !== 'client' || !a.clientWriter)
    throw forbidden('Only the owner or an editor of the vehicle can pay for a review.')
  const r = a.review
  if (r.state !== 'awaiting_payment' || !['unpaid', 'failed'].includes(r.paymentState)) {
    throw new HttpError(409, 'not_payable', 'This review is not waiting for a payment.')
  }
  const [me] = await ctx.db.select({ email: users.email }).from(users).where(eq(users.id, userId))
  const attempts = await ctx.db
    .select({ n: sql<number>`count(*)::int` })
    .from(reviewPayments)
    .where(eq(reviewPayments.reviewId, r.id))
  const base = appUrl(ctx)
  let session
  try {
    session = await (
      await stripeClient(ctx.env)
    ).checkout.sessions.create(
      {
        mode: 'payment',
        line_items: [
          {
            quantity: 1,
            price_data: {
              currency: r.currency.toLowerCase(),
              unit_amount: toMinorUnits(r.feeAmount),
              product_data: { name: `Review of “${r.scenarioName}”` },
            },
          },
        ],
        client_reference_id: r.id,
        customer_email: me?.email,
        success_url: `${base}/reviews/${r.id}?payment=done`,
        cancel_url: `${base}/reviews/${r.id}?payment=cancelled`,
        metadata: { reviewId: r.id, ohmward_webhook_url: `${base}/api/webhooks/payments` },
      },
      { idempotencyKey: `review-${r.id}-checkout-${attempts[0]?.n ?? 0}` },
    )
  } catch (err) {
    ctx.log.error({ err }, 'checkout session failed')
    throw serviceUnavailable(
      'The payment service did not answer. Nothing was charged; please try again in a moment.',
    )
  }
  await ctx.db
    .insert(reviewPayments)
    .values({
      reviewId: r.id,
      checkoutSessionId: session.id,
      amountMinor: toMinorUnits(r.feeAmount),
      currency: r.currency,
    })
    .onConflictDoNothing()
  if (!session.url) throw serviceUnavailable('The payment service gave no payment page.')
  return { url: session.url }
}

async function pinFor(
  db: Db | Tx,
  r: ReviewRow,
  kind: PinKind,
  itemId: string | null | undefined,
): Promise<{ itemId: string | null; label: string | null }> {
  if (kind === 'general') return { itemId: null, label: null }
  if (kind === 'battery') return { itemId: null, label: 'Battery bank' }
  if (kind === 'result') {
    const item = RESULT_ITEMS.find((i) => i.id === itemId)
    if (!item)
      throw validationFailed({ 'pin.itemId': [`must be one of ${RESULT_ITEMS.map((i) => i.id).join(', ')}`] })
    return { itemId: item.id, label: item.label }
  }
  if (!itemId || !UUID.test(itemId))
    throw validationFailed({
      'pin.itemId': [
        `must be the id of one of the vehicle’s ${kind === 'appliance' ? 'appliances' : 'charge sources'}`,
      ],
    })
  const table = kind === 'appliance' ? appliances : chargeSources
  const [row] = await db
    .select({ id: table.id, params: table.params })
    .from(table)
    .where(and(eq(table.id, itemId), eq(table.vehicleId, r.vehicleId)))
  if (!row)
    throw validationFailed({
      'pin.itemId': [`no such ${kind === 'appliance' ? 'appliance' : 'charge source'} on this vehicle`],
    })
  return { itemId: row.id, label: (row.params as { name?: string }).name ?? kind }
}

export async function addComment(
  ctx: AppContext,
  reviewId: string,
  userId: string,
  input: CommentCreate & { pin: { kind: PinKind; itemId?: string | null } },
): Promise<Comment> {
  return ctx.db.transaction(async (tx) => {
    const a = await loadReviewForUser(tx, reviewId, userId, true)
    let r = a.review
    if (a.side === 'client' && !a.clientWriter)
      throw forbidden('Your role on this vehicle lets you read the review, not write in it.')
    if (!isOpen(r.state)) {
      throw new HttpError(
        409,
        'review_not_open',
        r.state === 'closed' ? 'This review is closed.' : 'This review opens once the fee is paid.',
      )
    }
    const pin = await pinFor(tx, r, input.pin.kind, input.pin.itemId)
    const m = await mailContexts(tx, ctx, r)
    if (a.side === 'advisor' && r.state === 'requested') {
      r = await setState(tx, r.id, { state: 'in_progress', startedAt: new Date() })
      await addEvent(tx, r.id, `${m.advisorName} started the review.`, userId)
    }
    const [row] = await tx
      .insert(reviewComments)
      .values({
        reviewId: r.id,
        authorId: userId,
        kind: 'comment',
        body: input.body,
        pinKind: input.pin.kind,
        pinItemId: pin.itemId,
        pinLabel: pin.label,
      })
      .returning()
    await tx.update(reviews).set({ updatedAt: new Date() }).where(eq(reviews.id, r.id))
    await markRead(tx, r.id, userId)
    const authorName =
      a.side === 'advisor'
        ? m.advisorName
        : ((await names(tx, [userId])).get(userId)?.displayName ?? 'The client')
    const pinned = pin.label ? `“${pin.label}”` : 'the plan'
    const target = a.side === 'advisor' ? m.client : m.advisor
    await send(tx, target && reviewMails.comment(target, authorName, pinned, input.body))
    return toComment(row!, new Map([[userId, { id: userId, displayName: authorName, email: '' }]]), r)
  })
}

async function advisorAction(
  ctx: AppContext,
  reviewId: string,
  userId: string,
  fn: (tx: Tx, r: ReviewRow, m: Awaited<ReturnType<typeof mailContexts>>) => Promise<void>,
) {
  await ctx.db.transaction(async (tx) => {
    const a = await loadReviewForUser(tx, reviewId, userId, true)
    if (a.side !== 'advisor') throw forbidden('Only the review’s advisor can do this.')
    await fn(tx, a.review, await mailContexts(tx, ctx, a.review))
  })
}

export async function startReview(ctx: AppContext, reviewId: string, userId: string): Promise<void> {
  await advisorAction(ctx, reviewId, userId, async (tx, r, m) => {
    if (r.state !== 'requested')
      throw new HttpError(409, 'bad_state', 'Only a requested review can be started.')
    await setState(tx, r.id, { state: 'in_progress', startedAt: new Date() })
    await addEvent(tx, r.id, `${m.advisorName} started the review.`, userId)
    await send(tx, m.client && reviewMails.started(m.client, m.advisorName))
  })
}

export async function answerReview(
  ctx: AppContext,
  reviewId: string,
  userId: string,
  input: ReviewAnswer,
): Promise<void> {
  await advisorAction(ctx, reviewId, userId, async (tx, r, m) => {
    if (r.state !== 'in_progress' && r.state !== 'requested') {
      throw new HttpError(
        409,
        'bad_state',
        'A verdict can be given while the review is requested or in progress.',
      )
    }
    await setState(tx, r.id, {
      state: 'answered',
      verdict: input.verdict,
      summary: input.summary,
      answeredAt: new Date(),
      startedAt: r.startedAt ?? new Date(),
    })
    await addEvent(
      tx,
      r.id,
      `${m.advisorName} gave the verdict: ${REVIEW_VERDICT_LABEL[input.verdict]}.`,
      userId,
    )
    await send(
      tx,
      m.client &&
        reviewMails.answered(m.client, m.advisorName, REVIEW_VERDICT_LABEL[input.verdict], input.summary),
    )
  })
}

export async function closeReview(ctx: AppContext, reviewId: string, userId: string): Promise<void> {
  await ctx.db.transaction(async (tx) => {
    const a = await loadReviewForUser(tx, reviewId, userId, true)
    if (a.side === 'client' && !a.clientWriter)
      throw forbidden('Your role on this vehicle lets you read the review, not close it.')
    const r = a.review
    if (r.state !== 'answered')
      throw new HttpError(409, 'bad_state', 'A review can be closed once it has a verdict.')
    const m = await mailContexts(tx, ctx, r)
    await setState(tx, r.id, { state: 'closed', closeReason: 'done', closedAt: new Date() })
    const by =
      a.side === 'advisor'
        ? m.advisorName
        : ((await names(tx, [userId])).get(userId)?.displayName ?? 'The client')
    await addEvent(tx, r.id, `${by} closed the review.`, userId)
    const other = a.side === 'advisor' ? m.client : m.advisor
    await send(tx, other && reviewMails.closed(other, by))
  })
}

/**
 * Refund a paid review in full through the payment SDK (idempotent per payment) and mark it refund_pending;
 * the provider's `charge.refunded` event marks it refunded.
 */
async function refundInTx(ctx: AppContext, tx: Tx, r: ReviewRow): Promise<boolean> {
  if (r.paymentState !== 'paid') return false
  const [pay] = await tx
    .select()
    .from(reviewPayments)
    .where(and(eq(reviewPayments.reviewId, r.id), eq(reviewPayments.status, 'paid')))
    .orderBy(desc(reviewPayments.createdAt))
    .limit(1)
  if (!pay?.paymentIntentId) return false
  let refund
  try {
    refund = await (
      await stripeClient(ctx.env)
    ).refunds.create(
      { payment_intent: pay.paymentIntentId, reason: 'requested_by_customer', metadata: { reviewId: r.id } },
      { idempotencyKey: `refund-${pay.id}` },
    )
  } catch (err) {
    ctx.log.error({ err }, 'refund failed')
    throw serviceUnavailable(
      'The payment service did not answer, so the review was not cancelled. Please try again in a moment.',
    )
  }
  await tx
    .update(reviewPayments)
    .set({ status: 'refund_pending', refundId: refund.id, updatedAt: new Date() })
    .where(eq(reviewPayments.id, pay.id))
  return true
}

/** The client cancels before the review started: closed; a paid fee is refunded through the same SDK. */
export async function cancelReview(ctx: AppContext, reviewId: string, userId: string): Promise<void> {
  await ctx.db.transaction(async (tx) => {
    const a = await loadReviewForUser(tx, reviewId, userId, true)
    if (a.side !== 'client' || !a.clientWriter)
      throw forbidden('Only the owner or an editor of the vehicle can cancel a review.')
    const r = a.review
    if (r.state !== 'awaiting_payment' && r.state !== 'requested') {
      throw new HttpError(409, 'bad_state', 'A review can be cancelled only before the advisor starts on it.')
    }
    const refunding = await refundInTx(ctx, tx, r)
    const m = await mailContexts(tx, ctx, r)
    await setState(tx, r.id, {
      state: 'closed',
      closeReason: 'cancelled',
      closedAt: new Date(),
      ...(refunding ? { paymentState: 'refund_pending' as const } : {}),
    })
    const by = (await names(tx, [userId])).get(userId)?.displayName ?? 'The client'
    await addEvent(
      tx,
      r.id,
      `${by} cancelled the review${refunding ? '; the fee is being refunded' : ''}.`,
      userId,
    )
    if (r.state === 'requested') await send(tx, m.advisor && reviewMails.cancelled(m.advisor, by, false))
    if (refunding) await send(tx, m.client && reviewMails.cancelled(m.client, by, true))
  })
}

/** The advisor turns the request down before starting: closed; a paid fee is refunded. */
export async function declineReview(ctx: AppContext, reviewId: string, userId: string): Promise<void> {
  await advisorAction(ctx, reviewId, userId, async (tx, r, m) => {
    if (r.state !== 'awaiting_payment' && r.state !== 'requested') {
      throw new HttpError(409, 'bad_state', 'A review can be declined only before it starts.')
    }
    const refunding = await refundInTx(ctx, tx, r)
    await setState(tx, r.id, {
      state: 'closed',
      closeReason: 'declined',
      closedAt: new Date(),
      ...(refunding ? { paymentState: 'refund_pending' as const } : {}),
    })
    await addEvent(
      tx,
      r.id,
      `${m.advisorName} declined the review${refunding ? '; the fee is being refunded' : ''}.`,
      userId,
    )
    await send(tx, m.client && reviewMails.declined(m.client, m.advisorName, refunding))
  })
}

// ---------------------------------------------------------------------------------------------------------

async function markRead(db: Db | Tx, reviewId: string, userId: string): Promise<void> {
  await db
    .insert(reviewReads)
    .values({ reviewId, userId, lastReadAt: new Date() })
    .onConflictDoUpdate({
      target: [reviewReads.reviewId, reviewReads.userId],
      set: { lastReadAt: new Date() },
    })
}

function toComment(
  c: typeof reviewComments.$inferSelect,
  people: Map<string, { id: string; displayName: string }>,
  r: ReviewRow,
): Comment {
  const author = c.authorId ? people.get(c.authorId) : undefined
  return {
    id: c.id,
    kind: c.kind === 'event' ? 'event' : 'comment',
    author: author ? { id: author.id, displayName: author.displayName } : null,
    authorSide: c.authorId ? (c.authorId === r.advisorId ? 'advisor' : 'client') : null,
    body: c.body,
    pin: { kind: c.pinKind, itemId: c.pinItemId, label: c.pinLabel },
    createdAt: c.createdAt.toISOString(),
  }
}

const unreadSql = (userId: string) => sql<number>`(
  select count(*)::int from ${reviewComments} c
  where c.review_id = ${reviews.id}
    and (c.author_id is null or c.author_id <> ${userId})
    and c.created_at > coalesce((select rr.last_read_at from ${reviewReads} rr where rr.review_id = ${reviews.id} and rr.user_id = ${userId}), 'epoch'::timestamptz)
)`

function summaryOf(
  r: ReviewRow,
  vehicleName: string,
  people: Map<string, { id: string; displayName: string }>,
  userId: string,
  unread: number,
): ReviewSummary {
  const ref = (id: string | null) =>
    id && people.get(id) ? { id, displayName: people.get(id)!.displayName } : null
  return {
    id: r.id,
    vehicleId: r.vehicleId,
    vehicleName,
    scenarioId: r.scenarioId,
    scenarioName: r.scenarioName,
    requester: ref(r.requesterId),
    advisor: ref(r.advisorId) ?? { id: r.advisorId, displayName: 'Advisor' },
    state: r.state,
    paymentState: r.paymentState,
    feeAmount: normalizeFee(r.feeAmount),
    currency: r.currency,
    verdict: r.verdict,
    mySide: r.advisorId === userId ? 'advisor' : 'client',
    unread,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  }
}

/** The inbox: reviews I advise on, and reviews of vehicles I am on the crew of; newest activity first. */
export async function listReviews(ctx: AppContext, userId: string): Promise<ReviewSummary[]> {
  const rows = await ctx.db
    .select({ r: reviews, vehicleName: vehicles.name, unread: unreadSql(userId) })
    .from(reviews)
    .innerJoin(vehicles, eq(vehicles.id, reviews.vehicleId))
    .where(
      or(
        eq(reviews.advisorId, userId),
        sql`exists (select 1 from ${vehicleMemberships} m where m.vehicle_id = ${reviews.vehicleId} and m.user_id = ${userId})`,
      ),
    )
    .orderBy(desc(reviews.updatedAt))
    .limit(200)
  const people = await names(
    ctx.db,
    rows.flatMap((x) => [x.r.requesterId, x.r.advisorId]),
  )
  return rows.map((x) => summaryOf(x.r, x.vehicleName, people, userId, x.unread))
}

async function pinTargets(db: Db, vehicleId: string): Promise<PinTarget[]> {
  const apps = await db
    .select({ id: appliances.id, params: appliances.params })
    .from(appliances)
    .where(eq(appliances.vehicleId, vehicleId))
    .orderBy(asc(appliances.seq))
  const srcs = await db
    .select({ id: chargeSources.id, params: chargeSources.params })
    .from(chargeSources)
    .where(eq(chargeSources.vehicleId, vehicleId))
    .orderBy(asc(chargeSources.seq))
  return [
    { kind: 'general', itemId: null, label: 'The plan in general' },
    { kind: 'battery', itemId: null, label: 'Battery bank' },
    ...apps.map((a) => ({ kind: 'appliance' as const, itemId: a.id, label: a.params.name })),
    ...srcs.map((s) => ({ kind: 'source' as const, itemId: s.id, label: s.params.name })),
    ...RESULT_ITEMS.map((i) => ({ kind: 'result' as const, itemId: i.id, label: i.label })),
  ]
}

async function planSnapshot(db: Db, r: ReviewRow): Promise<PlanSnapshot> {
  const [bank] = await db
    .select({ params: batteryBanks.params })
    .from(batteryBanks)
    .where(eq(batteryBanks.vehicleId, r.vehicleId))
  const apps = await db
    .select({ id: appliances.id, params: appliances.params })
    .from(appliances)
    .where(eq(appliances.vehicleId, r.vehicleId))
    .orderBy(asc(appliances.seq))
  const srcs = await db
    .select({ id: chargeSources.id, params: chargeSources.params })
    .from(chargeSources)
    .where(eq(chargeSources.vehicleId, r.vehicleId))
    .orderBy(asc(chargeSources.seq))
  const [sc] = r.scenarioId ? await db.select().from(scenarios).where(eq(scenarios.id, r.scenarioId)) : []
  const b = bank?.params
  const rating = (p: Record<string, unknown>): string => {
    if (typeof p.peakPowerWp === 'number') return `${p.peakPowerWp} Wp`
    const a = [p.outputCurrentA, p.maxCurrentA, p.currentA].find((x) => typeof x === 'number')
    return typeof a === 'number' ? `${a} A` : ''
  }
  return {
    battery: b
      ? {
          chemistry: b.chemistry,
          cellsSeries: b.cellsSeries ?? null,
          cellsParallel: b.cellsParallel ?? null,
          capacityAh:
            b.capacityAh ?? (b.cellCapacityAh && b.cellsParallel ? b.cellCapacityAh * b.cellsParallel : null),
          socFloorFraction: b.socFloorFraction ?? null,
          chargeMinC: b.chargeMinC ?? null,
          heaterW:
            b.heater && typeof (b.heater as { powerW?: unknown }).powerW === 'number'
              ? (b.heater as { powerW: number }).powerW
              : null,
        }
      : null,
    appliances: apps.map((a) => ({
      id: a.id,
      name: a.params.name,
      powerW: a.params.powerW,
      supply: a.params.supply,
      quantity: a.params.quantity,
      hoursPerDay: a.params.hoursPerDay,
    })),
    sources: srcs.map((x) => ({
      id: x.id,
      name: x.params.name,
      kind: x.params.kind,
      ratingText: rating(x.params as unknown as Record<string, unknown>),
    })),
    trip: sc
      ? {
          placeName: sc.placeName,
          startDate: sc.trip.startDate,
          days: sc.trip.days,
          nightLowC: sc.trip.nightLowC,
          dayHighC: sc.trip.dayHighC,
          sky: String(sc.trip.sky),
        }
      : null,
  }
}

/** The thread; opening it marks it read for me. */
export async function getReview(ctx: AppContext, reviewId: string, userId: string): Promise<ReviewDetail> {
  const a = await loadReviewForUser(ctx.db, reviewId, userId)
  const r = a.review
  const [v] = await ctx.db.select({ name: vehicles.name }).from(vehicles).where(eq(vehicles.id, r.vehicleId))
  const [{ unread }] = (await ctx.db
    .select({ unread: unreadSql(userId) })
    .from(reviews)
    .where(eq(reviews.id, r.id))) as [{ unread: number }]
  const comments = await ctx.db
    .select()
    .from(reviewComments)
    .where(eq(reviewComments.reviewId, r.id))
    .orderBy(asc(reviewComments.createdAt))
  const people = await names(ctx.db, [r.requesterId, r.advisorId, ...comments.map((c) => c.authorId)])
  await markRead(ctx.db, r.id, userId)
  const advisor = a.side === 'advisor'
  const open = isOpen(r.state)
  const before = r.state === 'awaiting_payment' || r.state === 'requested'
  const canRead = !advisor || open || a.crewRole !== null
  return {
    ...summaryOf(r, v?.name ?? '', people, userId, unread),
    message: r.message,
    summary: r.summary,
    closeReason: r.closeReason,
    comments: comments.map((c) => toComment(c, people, r)),
    pinTargets: canRead ? await pinTargets(ctx.db, r.vehicleId) : [],
    snapshot: canRead ? await planSnapshot(ctx.db, r) : null,
    actions: {
      pay: a.clientWriter && r.state === 'awaiting_payment' && ['unpaid', 'failed'].includes(r.paymentState),
      cancel: a.clientWriter && before,
      decline: advisor && before,
      start: advisor && r.state === 'requested',
      comment: open && (advisor || a.clientWriter),
      answer: advisor && (r.state === 'requested' || r.state === 'in_progress'),
      close: r.state === 'answered' && (advisor || a.clientWriter),
    },
  }
}
