import { and, desc, eq, sql } from 'drizzle-orm'
import type { AppContext } from '../../server/context'
import { mailOutbox } from '../../server/db/schema/index'

/** The newest outbox mail of a kind to an address (read from the table, whether or not it was sent yet). */
export async function lastMail(ctx: AppContext, to: string, kind: string) {
  const [m] = await ctx.db
    .select()
    .from(mailOutbox)
    .where(and(sql`lower(${mailOutbox.toAddress}) = ${to.toLowerCase()}`, eq(mailOutbox.kind, kind)))
    .orderBy(desc(mailOutbox.id))
    .limit(1)
  return m ?? null
}

export async function mailCount(ctx: AppContext, to: string): Promise<number> {
  const rows = await ctx.db
    .select({ id: mailOutbox.id })
    .from(mailOutbox)
    .where(sql`lower(${mailOutbox.toAddress}) = ${to.toLowerCase()}`)
  return rows.length
}

/** The token from the link in a mail. */
export function tokenFrom(text: string): string {
  const m = /token=([a-z2-7]+)/.exec(text)
  if (!m) throw new Error('no link with a token in:\n' + text)
  return m[1]!
}

/** The `name=value` part of the session cookie a response set, or null. */
export function sessionCookie(setCookie: string[] | string | undefined): string | null {
  const list = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : []
  const c = list.find((x) => x.startsWith('ohmward_session='))
  if (!c) return null
  const pair = c.split(';')[0]!
  return pair === 'ohmward_session=' ? null : pair
}
