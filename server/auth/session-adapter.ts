/**
 * Lucia's Drizzle adapter with the one query every API request runs — the session and its user — as a named
 * prepared statement. The stock adapter rebuilds that SQL with Drizzle on every request and PostgreSQL parses
 * and plans it again each time; under load (bench:api) that was a fifth of the server's CPU. Everything else
 * (create, extend, delete sessions) is the stock adapter's.
 */
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle'
import type { DatabaseSession, DatabaseUser } from 'lucia'
import { eq, sql } from 'drizzle-orm'
import type { Db } from '../db/client'
import { sessions, users } from '../db/schema/index'

export class PreparedSessionAdapter extends DrizzlePostgreSQLAdapter {
  private readonly sessionAndUser

  constructor(db: Db) {
    super(db, sessions, users)
    this.sessionAndUser = db
      .select({
        sessionId: sessions.id,
        expiresAt: sessions.expiresAt,
        userId: users.id,
        email: users.email,
        displayName: users.displayName,
        role: users.role,
        emailVerifiedAt: users.emailVerifiedAt,
        unitSystem: users.unitSystem,
        temperatureUnit: users.temperatureUnit,
        currency: users.currency,
      })
      .from(sessions)
      .innerJoin(users, eq(sessions.userId, users.id))
      .where(eq(sessions.id, sql.placeholder('id')))
      .prepare('ohmward_session_and_user')
  }

  override async getSessionAndUser(
    sessionId: string,
  ): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const rows = await this.sessionAndUser.execute({ id: sessionId })
    const row = rows.length === 1 ? rows[0] : undefined
    if (!row) return [null, null]
    const { sessionId: id, expiresAt, userId, ...attributes } = row
    return [
      { id, userId, expiresAt, attributes: {} },
      { id: userId, attributes },
    ]
  }
}
