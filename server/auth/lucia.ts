import { Lucia, TimeSpan } from 'lucia'
import type { Db } from '../db/client'
import { PreparedSessionAdapter } from './session-adapter'

/** Session cookie name; sessions last 30 days and extend when used in their second half (Lucia's rule). */
export const SESSION_COOKIE = 'ohmward_session'

export function createLucia(db: Db, secureCookies: boolean) {
  const adapter = new PreparedSessionAdapter(db)
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(30, 'd'),
    sessionCookie: {
      name: SESSION_COOKIE,
      expires: true,
      attributes: { secure: secureCookies, sameSite: 'lax', path: '/' },
    },
    getUserAttributes: (a) => ({
      email: a.email,
      displayName: a.displayName,
      role: a.role,
      emailVerifiedAt: a.emailVerifiedAt,
      unitSystem: a.unitSystem,
      temperatureUnit: a.temperatureUnit,
      currency: a.currency,
    }),
  })
}

export type AppLucia = ReturnType<typeof createLucia>

interface DatabaseUserAttributes {
  email: string
  displayName: string
  role: 'member' | 'advisor' | 'admin'
  emailVerifiedAt: Date | null
  unitSystem: 'metric' | 'imperial'
  temperatureUnit: 'C' | 'F'
  currency: string
}

declare module 'lucia' {
  interface Register {
    Lucia: AppLucia
    DatabaseUserAttributes: DatabaseUserAttributes
  }
}
