import { z } from 'zod'

/** Environment, parsed once at start; a bad value stops the process with the variable's name. */
const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.string().url().default('postgres://postgres@127.0.0.1:54329/ohmward'),
  /** Public address of the app, used in e-mailed links and for the Origin check. */
  APP_URL: z.string().url().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  SMTP_SECURE: z.enum(['true', 'false']).default('false'),
  MAIL_FROM: z.string().default('Ohmward <hello@ohmward.local>'),
  STRIPE_SECRET_KEY: z.string().default('sk_test_ohmward_local'),
  STRIPE_WEBHOOK_SECRET: z.string().default('whsec_ohmward_local'),
  STRIPE_API_URL: z.string().url().optional(),
  RATE_LIMIT_PER_MINUTE: z.coerce.number().int().positive().default(600),
  /** Sign-in, sign-up and password-reset attempts allowed per client address in each window (each limit apart). */
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().positive().optional(),
  AUTH_RATE_LIMIT_WINDOW_SECONDS: z.coerce.number().int().positive().default(900),
  /** Outbox worker: how often it looks for due mail, the first retry delay (doubling), and the attempts before giving up. */
  MAIL_POLL_MS: z.coerce.number().int().positive().default(1000),
  MAIL_RETRY_BASE_SECONDS: z.coerce.number().positive().default(30),
  MAIL_MAX_ATTEMPTS: z.coerce.number().int().positive().default(20),
  /** The local fake SMTP server's HTTP API (development and tests), read by the /dev mailbox. */
  OHMWARD_FAKE_MAIL_API: z.string().url().optional(),
})

export type Env = z.infer<typeof EnvSchema>

export function loadEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = EnvSchema.safeParse(source)
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`)
    throw new Error(`Invalid environment:\n${lines.join('\n')}`)
  }
  const env = parsed.data
  // Tests sign in many times from one address; they lower the limit explicitly when they test it.
  env.AUTH_RATE_LIMIT_MAX ??= env.NODE_ENV === 'test' ? 10_000 : 10
  return env
}
