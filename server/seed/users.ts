import { users } from '../db/schema/index'
import type { Db } from '../db/client'
import { hashPassword } from '../auth/password'

/**
 * Demo people (invented). Passwords are documented in the README; they exist only in the demo database.
 */
export const DEMO_USERS = [
  {
    id: 'demo-ines',
    email: 'ines@demo.ohmward.local',
    displayName: 'Ines Lindqvist',
    role: 'member',
    password: 'van-life-demo-1',
  },
  {
    id: 'demo-tomas',
    email: 'tomas@demo.ohmward.local',
    displayName: 'Tomas Brennan',
    role: 'member',
    password: 'van-life-demo-2',
  },
  {
    id: 'demo-halvard',
    email: 'halvard@demo.ohmward.local',
    displayName: 'Halvard Moe',
    role: 'advisor',
    password: 'advisor-demo-3',
  },
  {
    id: 'demo-admin',
    email: 'admin@demo.ohmward.local',
    displayName: 'Ohmward Admin',
    role: 'admin',
    password: 'admin-demo-4',
  },
] as const

export async function seedUsers(db: Db): Promise<void> {
  for (const u of DEMO_USERS) {
    await db
      .insert(users)
      .values({
        id: u.id,
        email: u.email,
        displayName: u.displayName,
        role: u.role,
        passwordHash: await hashPassword(u.password),
        emailVerifiedAt: new Date(),
      })
      .onConflictDoNothing()
  }
}
