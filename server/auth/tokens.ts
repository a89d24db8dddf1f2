import { sha256 } from '@oslojs/crypto/sha2'
import { encodeBase32LowerCaseNoPadding, encodeHexLowerCase } from '@oslojs/encoding'
import { and, eq, isNull, sql } from 'drizzle-orm'
import type { Db } from '../db/client'
import { authTokens } from '../db/schema/index'

export type TokenPurpose = 'verify_email' | 'reset_password' | 'change_email'

/** How long each kind of link works. */
export const TOKEN_LIFETIME_MS: Record<TokenPurpose, number> = {
  verify_email: 48 * 3600_000,
  reset_password: 3600_000,
  change_email: 24 * 3600_000,
}

/** SHA-256 (hex) of a token: the only form that is stored. */
export function hashToken(token: string): string {
  return encodeHexLowerCase(sha256(new TextEncoder().encode(token)))
}

/**
 * A new random token (25 bytes, base32) for a user and purpose. Earlier unused tokens of the same purpose
 * are retired, so only the newest link works. Returns the token, which goes into the mail and nowhere else.
 */
export async function issueToken(
  db: Db,
  userId: string,
  purpose: TokenPurpose,
  email: string,
  now = new Date(),
): Promise<string> {
  const bytes = crypto.getRandomValues(new Uint8Array(25))
  const token = encodeBase32LowerCaseNoPadding(bytes)
  await db
    .update(authTokens)
    .set({ usedAt: now })
    .where(and(eq(authTokens.userId, userId), eq(authTokens.purpose, purpose), isNull(authTokens.usedAt)))
  await db.insert(authTokens).values({
    tokenHash: hashToken(token),
    userId,
    purpose,
    email,
    expiresAt: new Date(now.getTime() + TOKEN_LIFETIME_MS[purpose]),
  })
  return token
}

/**
 * Use a token once: atomically marks it used and returns its user and address, or null when it is unknown,
 * already used, expired or for another purpose.
 */
export async function consumeToken(
  db: Db,
  token: string,
  purpose: TokenPurpose,
): Promise<{ userId: string; email: string } | null> {
  const rows = await db
    .update(authTokens)
    .set({ usedAt: sql`now()` })
    .where(
      and(
        eq(authTokens.tokenHash, hashToken(token)),
        eq(authTokens.purpose, purpose),
        isNull(authTokens.usedAt),
        sql`${authTokens.expiresAt} > now()`,
      ),
    )
    .returning({ userId: authTokens.userId, email: authTokens.email })
  return rows[0] ?? null
}
