import { passwordProblem } from '@shared/schemas/account'

/** Quasar field rules built from the shared account rules, so the form says what the server would. */
const EMAIL_RE = /^[^\s@]+@[^\s@]+\.[^\s@]+$/

export const emailRules = [
  (v: string) => !!v?.trim() || 'Enter your e-mail address.',
  (v: string) => EMAIL_RE.test(v.trim()) || 'That does not look like an e-mail address.',
]
export const requiredRule = (message: string) => (v: string) => !!v?.trim() || message
export const newPasswordRules = (email?: () => string) => [
  (v: string) => passwordProblem(v ?? '', email?.()) ?? true,
]

/** Where to go after signing in: only paths inside the app. */
export function safeNext(next: unknown, fallback = '/vehicles'): string {
  return typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') ? next : fallback
}
