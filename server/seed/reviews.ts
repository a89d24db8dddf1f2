import { sql } from 'drizzle-orm'
import type { Db } from '../db/client'
import { advisorProfiles, users } from '../db/schema/index'

/**
 * The demo advisor's directory profile (issue 8). Invented person and bio; the fee is exact decimal money.
 * Runs after the demo users; does nothing if the advisor account is absent or already has a profile.
 */
export async function seedReviews(db: Db): Promise<void> {
  const [halvard] = await db
    .select({ id: users.id })
    .from(users)
    .where(sql`lower(${users.email}) = 'halvard@demo.ohmward.local'`)
  if (!halvard) return
  await db
    .insert(advisorProfiles)
    .values({
      userId: halvard.id,
      headline: 'Auto-electrician for vans, trucks and small boats',
      bio:
        'I have wired camper conversions in a workshop outside Trondheim for fifteen years, mostly 12 V lithium builds with ' +
        'DC-DC charging and roof solar, plus a few 24 V expedition trucks. I read your plan the way I would check it before ' +
        'quoting: fuses and cable runs, what the fridge really draws in winter, whether the cells can be charged on a cold ' +
        'morning, and whether the bank matches the trip you describe. Plain answers, item by item.',
      specialities: ['LiFePO4 packs', 'Winter use', 'DC-DC charging', 'Fusing and cables', 'Small boats'],
      feeAmount: '45.00',
      currency: 'EUR',
      accepting: true,
    })
    .onConflictDoNothing()
}
