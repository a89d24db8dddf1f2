import { loadEnv } from '../../server/env'
import { buildContext } from '../../server/build-context'
import type { AppContext } from '../../server/context'

/**
 * An app context against the throwaway test database that `npm test` created (DATABASE_URL).
 * Refuses to run against anything that is not a test database (w3cj's guard).
 */
export function testContext(overrides: Record<string, string> = {}): AppContext {
  const url = overrides.DATABASE_URL ?? process.env.DATABASE_URL ?? ''
  if (!/\/ohmward_test|\/t_[a-z0-9_]+$/.test(url)) {
    throw new Error(`Refusing to run tests against ${url || '(no DATABASE_URL)'}: run them with npm test`)
  }
  const env = loadEnv({ ...process.env, NODE_ENV: 'test', LOG_LEVEL: 'silent', ...overrides })
  return buildContext(env, { poolMax: 5 })
}

/** A unique suffix for e-mails and names, so test files can share one database. */
export function uniq(prefix = 't'): string {
  return `${prefix}${Date.now().toString(36)}${Math.random().toString(36).slice(2, 8)}`
}
