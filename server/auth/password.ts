import { hash, verify } from '@node-rs/argon2'

/**
 * argon2id with the OWASP Password Storage Cheat Sheet's first recommended setting
 * (m = 19 MiB, t = 2, p = 1); @node-rs/argon2's defaults are argon2id with these numbers.
 */
export const ARGON2_OPTIONS = { memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const

export function hashPassword(password: string): Promise<string> {
  return hash(password, ARGON2_OPTIONS)
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password)
  } catch {
    return false
  }
}

/** A hash of a random password, verified against when the e-mail is unknown, so timing is similar. */
let dummyHash: Promise<string> | null = null
export function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword('ohmward-timing-equaliser-' + Math.random())
  return dummyHash
}
