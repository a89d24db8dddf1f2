import { describe, it, expect } from 'vitest'
import { localMidnightUtcMs, utcOffsetMin } from './localTime.ts'

// Source: the IANA time zone database via the platform's Intl (Europe/Oslo is CET, UTC+1, and CEST, UTC+2,
// from the last Sunday of March to the last Sunday of October; America/Denver is MST, UTC−7 / MDT, UTC−6).
describe('local clock from an IANA zone', () => {
  it('finds winter and summer offsets', () => {
    expect(utcOffsetMin(Date.parse('2027-02-08T12:00:00Z'), 'Europe/Oslo')).toBe(60)
    expect(utcOffsetMin(Date.parse('2027-07-01T12:00:00Z'), 'Europe/Oslo')).toBe(120)
    expect(utcOffsetMin(Date.parse('2027-01-10T12:00:00Z'), 'America/Denver')).toBe(-420)
    expect(utcOffsetMin(Date.parse('2027-01-10T12:00:00Z'), 'Asia/Kolkata')).toBe(330)
  })
  it('puts local midnight at the right UTC instant', () => {
    expect(new Date(localMidnightUtcMs('2027-02-08', 0, 'Europe/Oslo')).toISOString()).toBe(
      '2027-02-07T23:00:00.000Z',
    )
    expect(new Date(localMidnightUtcMs('2027-07-01', 2, 'Europe/Madrid')).toISOString()).toBe(
      '2027-07-02T22:00:00.000Z',
    )
  })
})
