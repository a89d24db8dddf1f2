import type { Logger } from 'pino'
import type pg from 'pg'
import type { Db } from './db/client'
import type { Env } from './env'
import type { AppLucia } from './auth/lucia'

/** What route modules get: the database, auth, settings and the logger. No module keeps state of its own. */
export interface AppContext {
  db: Db
  pool: pg.Pool
  lucia: AppLucia
  env: Env
  log: Logger
}
