import { users } from '../../server/db/schema/index'
import type { AppContext } from '../../server/context'
import { hashPassword } from '../../server/auth/password'
import { uniq } from './context'

export interface TestUser {
  id: string
  email: string
  password: string
  displayName: string
  role: 'member' | 'advisor' | 'admin'
  /** `Cookie` header value of a fresh session for this user. */
  cookie: string
}

/** A verified user with a session, straight into the database (no HTTP, no mail). */
export async function createUser(
  ctx: AppContext,
  opts: {
    role?: TestUser['role']
    email?: string
    password?: string
    displayName?: string
    verified?: boolean
  } = {},
): Promise<TestUser> {
  const id = uniq('u_')
  const email = (opts.email ?? `${id}@test.ohmward.local`).toLowerCase()
  const password = opts.password ?? 'correct-horse-battery-9'
  const displayName = opts.displayName ?? `Test ${id.slice(-5)}`
  const role = opts.role ?? 'member'
  await ctx.db.insert(users).values({
    id,
    email,
    displayName,
    role,
    passwordHash: await hashPassword(password),
    emailVerifiedAt: opts.verified === false ? null : new Date(),
  })
  const session = await ctx.lucia.createSession(id, {})
  const cookie = ctx.lucia.createSessionCookie(session.id).serialize().split(';')[0]!
  return { id, email, password, displayName, role, cookie }
}
