import type { Env } from './env'
import type { AppContext } from './context'
import { createDatabase } from './db/client'
import { createLucia } from './auth/lucia'
import { createLogger } from './logger'

/** Wire the database, auth and logger from the environment (used by the server and by the tests). */
export function buildContext(env: Env, options: { poolMax?: number } = {}): AppContext {
  const { pool, db } = createDatabase(env.DATABASE_URL, { max: options.poolMax ?? 10 })
  const secure = env.APP_URL?.startsWith('https:') ?? false
  return { db, pool, env, lucia: createLucia(db, secure), log: createLogger(env.LOG_LEVEL) }
}
