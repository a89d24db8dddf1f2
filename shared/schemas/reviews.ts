/**
 * API contract for advisors and reviews (issue 8). Routes: docs/reviews.md.
 * Money is exact: fees travel as decimal strings ("45.00") with an ISO 4217 currency.
 */
import { z } from 'zod'

export const REVIEW_STATES = ['requested', 'awaiting_payment', 'in_progress', 'answered', 'closed'] as const
export type ReviewState = (typeof REVIEW_STATES)[number]
/** Our words for the states (DESIGN.md). */
export const REVIEW_STATE_LABEL: Record<ReviewState, string> = {
  requested: 'Requested',
  awaiting_payment: 'Awaiting payment',
  in_progress: 'In progress',
  answered: 'Answered',
  closed: 'Closed',
}
/** States in which the advisor can read the vehicle and write in the thread. */
export const OPEN_REVIEW_STATES: readonly ReviewState[] = ['requested', 'in_progress', 'answered']

export const REVIEW_VERDICTS = ['sound', 'sound_with_changes', 'rethink'] as const
export type ReviewVerdict = (typeof REVIEW_VERDICTS)[number]
export const REVIEW_VERDICT_LABEL: Record<ReviewVerdict, string> = {
  sound: 'Sound as planned',
  sound_with_changes: 'Sound with the changes below',
  rethink: 'Needs a rethink',
}

export const PAYMENT_STATES = ['none', 'unpaid', 'failed', 'paid', 'refund_pending', 'refunded'] as const
export type PaymentState = (typeof PAYMENT_STATES)[number]
export const PAYMENT_STATE_LABEL: Record<PaymentState, string> = {
  none: 'No fee',
  unpaid: 'Not paid yet',
  failed: 'Payment did not go through',
  paid: 'Paid',
  refund_pending: 'Refund on its way',
  refunded: 'Refunded',
}

export const PIN_KINDS = ['general', 'appliance', 'source', 'battery', 'result'] as const
export type PinKind = (typeof PIN_KINDS)[number]

/** Results of a scenario's outlook a comment can be pinned to. */
export const RESULT_ITEMS = [
  { id: 'verdict', label: 'Verdict' },
  { id: 'lowest-soc', label: 'Lowest state of charge' },
  { id: 'autonomy', label: 'Days of autonomy' },
  { id: 'pack-needed', label: 'Pack needed' },
  { id: 'solar-needed', label: 'Solar needed' },
  { id: 'heater', label: 'Heater energy' },
] as const

export const FEE_CURRENCIES = [
  'EUR',
  'GBP',
  'USD',
  'CHF',
  'NOK',
  'SEK',
  'DKK',
  'PLN',
  'CZK',
  'CAD',
  'AUD',
  'NZD',
] as const

/** A fee: 0 to 10 000 with at most two decimals, as text so no float rounding ever touches it. */
export const FeeAmountSchema = z
  .union([z.string(), z.number()], { error: 'must be an amount such as 45 or 45.50' })
  .transform((v) => String(v).trim())
  .pipe(
    z
      .string()
      .regex(/^\d{1,5}(\.\d{1,2})?$/, 'must be an amount such as 45 or 45.50 (at most two decimals)')
      .refine((s) => Number(s) <= 10_000, 'must be at most 10000'),
  )

export const SPECIALITIES_MAX = 12

/** PUT /api/advisors/me (advisor accounts). `version` 0 creates the profile. */
export const AdvisorProfilePutSchema = z.strictObject({
  version: z.number({ error: 'is required' }).int().min(0),
  headline: z.string().trim().max(120, 'must be at most 120 characters'),
  bio: z.string().trim().min(1, 'must not be empty').max(4000, 'must be at most 4000 characters'),
  specialities: z
    .array(z.string().trim().min(1, 'must not be empty').max(60, 'must be at most 60 characters'))
    .max(SPECIALITIES_MAX, `at most ${SPECIALITIES_MAX}`),
  feeAmount: FeeAmountSchema,
  currency: z.enum(FEE_CURRENCIES, { error: `must be one of ${FEE_CURRENCIES.join(', ')}` }),
  accepting: z.boolean({ error: 'must be true or false' }),
})
export type AdvisorProfilePut = z.input<typeof AdvisorProfilePutSchema>

export const AdvisorProfileSchema = z.object({
  userId: z.string(),
  displayName: z.string(),
  headline: z.string(),
  bio: z.string(),
  specialities: z.array(z.string()),
  feeAmount: z.string(),
  currency: z.string(),
  accepting: z.boolean(),
  version: z.number().int(),
  updatedAt: z.string(),
})
export type AdvisorProfile = z.infer<typeof AdvisorProfileSchema>
export const AdvisorListSchema = z.object({ items: z.array(AdvisorProfileSchema) })
export type AdvisorList = z.infer<typeof AdvisorListSchema>

/** POST /api/reviews: ask an advisor to review a scenario (owner or editor of its vehicle). */
export const ReviewCreateSchema = z.strictObject({
  scenarioId: z.uuid({ error: 'must be a scenario id' }),
  advisorId: z.string({ error: 'is required' }).min(1, 'is required'),
  message: z
    .string({ error: 'is required' })
    .trim()
    .min(1, 'must not be empty')
    .max(4000, 'must be at most 4000 characters'),
})
export type ReviewCreate = z.infer<typeof ReviewCreateSchema>

export const PinSchema = z
  .strictObject({
    kind: z.enum(PIN_KINDS, { error: `must be one of ${PIN_KINDS.join(', ')}` }),
    itemId: z.string().max(100).nullable().optional(),
  })
  .default({ kind: 'general' })

/** POST /api/reviews/:reviewId/comments */
export const CommentCreateSchema = z.strictObject({
  body: z
    .string({ error: 'is required' })
    .trim()
    .min(1, 'must not be empty')
    .max(8000, 'must be at most 8000 characters'),
  pin: PinSchema,
})
export type CommentCreate = z.input<typeof CommentCreateSchema>

/** POST /api/reviews/:reviewId/answer (advisor): the verdict and summary. */
export const ReviewAnswerSchema = z.strictObject({
  verdict: z.enum(REVIEW_VERDICTS, { error: `must be one of ${REVIEW_VERDICTS.join(', ')}` }),
  summary: z
    .string({ error: 'is required' })
    .trim()
    .min(1, 'must not be empty')
    .max(8000, 'must be at most 8000 characters'),
})
export type ReviewAnswer = z.infer<typeof ReviewAnswerSchema>

const UserRef = z.object({ id: z.string(), displayName: z.string() })

export const ReviewSummarySchema = z.object({
  id: z.string(),
  vehicleId: z.string(),
  vehicleName: z.string(),
  scenarioId: z.string().nullable(),
  scenarioName: z.string(),
  requester: UserRef.nullable(),
  advisor: UserRef,
  state: z.enum(REVIEW_STATES),
  paymentState: z.enum(PAYMENT_STATES),
  feeAmount: z.string(),
  currency: z.string(),
  verdict: z.enum(REVIEW_VERDICTS).nullable(),
  /** Which side of the review the signed-in user is on. */
  mySide: z.enum(['client', 'advisor']),
  unread: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
})
export type ReviewSummary = z.infer<typeof ReviewSummarySchema>
export const ReviewListSchema = z.object({ items: z.array(ReviewSummarySchema) })
export type ReviewList = z.infer<typeof ReviewListSchema>

export const CommentSchema = z.object({
  id: z.string(),
  kind: z.enum(['comment', 'event']),
  author: UserRef.nullable(),
  authorSide: z.enum(['client', 'advisor']).nullable(),
  body: z.string(),
  pin: z.object({ kind: z.enum(PIN_KINDS), itemId: z.string().nullable(), label: z.string().nullable() }),
  createdAt: z.string(),
})
export type Comment = z.infer<typeof CommentSchema>

export const PinTargetSchema = z.object({
  kind: z.enum(PIN_KINDS),
  itemId: z.string().nullable(),
  label: z.string(),
})
export type PinTarget = z.infer<typeof PinTargetSchema>

/** What the signed-in user may do now (the page shows only these buttons). */
export const ReviewActionsSchema = z.object({
  pay: z.boolean(),
  cancel: z.boolean(),
  decline: z.boolean(),
  start: z.boolean(),
  comment: z.boolean(),
  answer: z.boolean(),
  close: z.boolean(),
})

/**
 * A read-only summary of the vehicle and scenario, in the thread itself, so the advisor sees what they comment
 * on (null once the advisor's access has ended). SI units in the field names.
 */
export const PlanSnapshotSchema = z.object({
  battery: z
    .object({
      chemistry: z.string(),
      cellsSeries: z.number().nullable(),
      cellsParallel: z.number().nullable(),
      capacityAh: z.number().nullable(),
      socFloorFraction: z.number().nullable(),
      chargeMinC: z.number().nullable(),
      heaterW: z.number().nullable(),
    })
    .nullable(),
  appliances: z.array(
    z.object({
      id: z.string(),
      name: z.string(),
      powerW: z.number(),
      supply: z.string(),
      quantity: z.number(),
      hoursPerDay: z.number(),
    }),
  ),
  sources: z.array(z.object({ id: z.string(), name: z.string(), kind: z.string(), ratingText: z.string() })),
  trip: z
    .object({
      placeName: z.string(),
      startDate: z.string(),
      days: z.number(),
      nightLowC: z.number(),
      dayHighC: z.number(),
      sky: z.string(),
    })
    .nullable(),
})
export type PlanSnapshot = z.infer<typeof PlanSnapshotSchema>

/** GET /api/reviews/:reviewId: the thread (opening it marks it read). */
export const ReviewDetailSchema = ReviewSummarySchema.extend({
  message: z.string(),
  summary: z.string().nullable(),
  closeReason: z.enum(['done', 'cancelled', 'declined']).nullable(),
  comments: z.array(CommentSchema),
  /** Items of the vehicle a comment can be pinned to. */
  pinTargets: z.array(PinTargetSchema),
  snapshot: PlanSnapshotSchema.nullable(),
  actions: ReviewActionsSchema,
})
export type ReviewDetail = z.infer<typeof ReviewDetailSchema>

/** POST /api/reviews/:reviewId/checkout answer: where to send the payer. */
export const CheckoutSchema = z.object({ url: z.string() })
