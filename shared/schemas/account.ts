import { z } from 'zod'

/**
 * Account API contracts, shared by the server (validation) and the client (field rules and messages).
 */

export const PASSWORD_MIN_LENGTH = 10
export const PASSWORD_MAX_LENGTH = 200

/** A few passwords people pick first; longer lists live in breach corpora we do not ship. */
const TOO_COMMON = new Set([
  'password123',
  'password1234',
  '1234567890',
  '12345678910',
  'qwertyuiop',
  'iloveyou123',
  'letmein1234',
  'welcome1234',
  'changeme123',
  'ohmward1234',
  'passw0rd123',
])

export const PASSWORD_RULE_TEXT = `At least ${PASSWORD_MIN_LENGTH} characters. A short sentence or three unrelated words is easy to remember and hard to guess.`

/** Why a password is refused, in plain words, or null when it is fine. */
export function passwordProblem(password: string, email?: string): string | null {
  if (password.length < PASSWORD_MIN_LENGTH)
    return `Use at least ${PASSWORD_MIN_LENGTH} characters (this one has ${password.length}). A short sentence works well.`
  if (password.length > PASSWORD_MAX_LENGTH) return `Use at most ${PASSWORD_MAX_LENGTH} characters.`
  if (new Set(password).size < 4) return 'Use more than three different characters.'
  if (TOO_COMMON.has(password.toLowerCase()))
    return 'This password is one of the first ones people guess. Pick another.'
  if (
    email &&
    password.toLowerCase().includes(email.toLowerCase().split('@')[0]!) &&
    email.split('@')[0]!.length >= 4
  )
    return 'Do not build the password from your e-mail address.'
  return null
}

export const EmailSchema = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .min(1, 'Enter your e-mail address.')
  .max(254, 'That e-mail address is too long.')
  .email('That does not look like an e-mail address.')
  .transform((s) => s.toLowerCase())

export const DisplayNameSchema = z
  .string({ error: 'Enter a display name.' })
  .trim()
  .min(1, 'Enter a display name.')
  .max(80, 'Keep the display name under 80 characters.')

/** A new password: the strength rule. (Sign-in takes any string, so old passwords keep working.) */
export const NewPasswordSchema = z.string({ error: 'Enter a password.' }).max(PASSWORD_MAX_LENGTH)

export const SignUpSchema = z
  .object({ email: EmailSchema, displayName: DisplayNameSchema, password: NewPasswordSchema })
  .superRefine((v, c) => {
    const p = passwordProblem(v.password, v.email)
    if (p) c.addIssue({ code: 'custom', path: ['password'], message: p })
  })

export const SignInSchema = z.object({
  email: EmailSchema,
  password: z
    .string({ error: 'Enter your password.' })
    .min(1, 'Enter your password.')
    .max(PASSWORD_MAX_LENGTH),
})

export const EmailOnlySchema = z.object({ email: EmailSchema })

export const TokenSchema = z.object({
  token: z.string({ error: 'The link is incomplete.' }).min(10, 'The link is incomplete.').max(200),
})

export const ResetPasswordSchema = TokenSchema.extend({ password: NewPasswordSchema }).superRefine((v, c) => {
  const p = passwordProblem(v.password)
  if (p) c.addIssue({ code: 'custom', path: ['password'], message: p })
})

export const ChangePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, 'Enter your current password.').max(PASSWORD_MAX_LENGTH),
    newPassword: NewPasswordSchema,
  })
  .superRefine((v, c) => {
    const p = passwordProblem(v.newPassword)
    if (p) c.addIssue({ code: 'custom', path: ['newPassword'], message: p })
  })

export const ChangeEmailSchema = z.object({
  newEmail: EmailSchema,
  password: z.string().min(1, 'Enter your current password.').max(PASSWORD_MAX_LENGTH),
})

export const CURRENCIES = [
  'EUR',
  'USD',
  'GBP',
  'SEK',
  'NOK',
  'DKK',
  'CHF',
  'CAD',
  'AUD',
  'NZD',
  'PLN',
] as const

export const ProfileSchema = z.object({
  displayName: DisplayNameSchema.optional(),
  unitSystem: z.enum(['metric', 'imperial'], { error: 'Pick metric or imperial.' }).optional(),
  temperatureUnit: z.enum(['C', 'F'], { error: 'Pick °C or °F.' }).optional(),
  currency: z.enum(CURRENCIES, { error: 'Pick one of the listed currencies.' }).optional(),
  /** The version the edit was made on; a stale one is refused with 409. */
  version: z.number().int().positive().optional(),
})

export const RoleChangeSchema = z.object({
  role: z.enum(['member', 'advisor'], { error: 'The role must be member or advisor.' }),
})

export type AccountRole = 'member' | 'advisor' | 'admin'

/** The signed-in user as the API shows it. */
export interface PublicUser {
  id: string
  email: string
  displayName: string
  role: AccountRole
  emailVerified: boolean
  unitSystem: 'metric' | 'imperial'
  temperatureUnit: 'C' | 'F'
  currency: string
  version: number
}

export interface AdminUserRow {
  id: string
  email: string
  displayName: string
  role: AccountRole
  emailVerified: boolean
  createdAt: string
}

export interface AdminUserPage {
  items: AdminUserRow[]
  total: number
  page: number
  pageSize: number
}
