import { describe, it, expect } from 'vitest'
import { passwordProblem, SignUpSchema, ProfileSchema } from './account'

describe('password rule (ours: length and a short block list rather than composition rules, in the spirit of NIST SP 800-63B §5.1.1.2, cited from memory)', () => {
  it('accepts a long passphrase and refuses short, repetitive, common or e-mail-based ones with a reason', () => {
    expect(passwordProblem('three unrelated words')).toBeNull()
    expect(passwordProblem('short')).toMatch(/at least 10 characters \(this one has 5\)/)
    expect(passwordProblem('aaaaaaaaaaaaaa')).toMatch(/more than three different characters/)
    expect(passwordProblem('Password123')).toMatch(/first ones people guess/)
    expect(passwordProblem('rosalind-2024!', 'rosalind@example.org')).toMatch(/e-mail address/)
    expect(passwordProblem('x'.repeat(150) + 'abcdefghijklmnopqrstuvwxyz'.repeat(3))).toMatch(/at most 200/)
  })

  it('names the field in sign-up errors and lower-cases the e-mail', () => {
    const bad = SignUpSchema.safeParse({ email: 'a@b.co', displayName: 'A', password: 'short' })
    expect(bad.success).toBe(false)
    expect(bad.error!.issues[0]!.path).toEqual(['password'])
    const ok = SignUpSchema.parse({
      email: ' Ada@Example.ORG ',
      displayName: ' Ada ',
      password: 'long enough phrase',
    })
    expect(ok).toMatchObject({ email: 'ada@example.org', displayName: 'Ada' })
  })

  it('accepts only known unit and currency choices', () => {
    expect(
      ProfileSchema.safeParse({ unitSystem: 'imperial', temperatureUnit: 'F', currency: 'NOK' }).success,
    ).toBe(true)
    expect(ProfileSchema.safeParse({ temperatureUnit: 'K' }).success).toBe(false)
  })
})
