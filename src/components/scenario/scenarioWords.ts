import type { SkyKind } from '@shared/schemas/plan'

/** "12 Jan – 18 Jan 2027 · 7 days" (dates are the trip's local calendar). */
export function formatTripDates(startDate: string, days: number): string {
  const [y, m, d] = startDate.split('-').map(Number) as [number, number, number]
  const start = new Date(Date.UTC(y, m - 1, d))
  const end = new Date(Date.UTC(y, m - 1, d + days - 1))
  const opts: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', timeZone: 'UTC' }
  const a = start.toLocaleDateString('en-GB', opts)
  const b = end.toLocaleDateString('en-GB', { ...opts, year: 'numeric' })
  return `${days === 1 ? b : `${a} – ${b}`} · ${days} day${days === 1 ? '' : 's'}`
}

export const SKY_LABELS: Record<SkyKind, { label: string; icon: string; hint: string }> = {
  clear: { label: 'Mostly clear', icon: 'wb_sunny', hint: 'Sunny days, the clear-sky sun' },
  mixed: { label: 'Mixed', icon: 'wb_cloudy', hint: 'Sun and cloud, about half the clear-sky sun' },
  overcast: { label: 'Overcast', icon: 'cloud', hint: 'Grey days, about a fifth of the clear-sky sun' },
  custom: { label: 'My own number', icon: 'tune', hint: 'A clearness index you choose' },
}

export const WEEKDAYS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'] as const

/** Adds days to an ISO date (YYYY-MM-DD) on the calendar. */
export function addDays(isoDate: string, n: number): string {
  const [y, m, d] = isoDate.split('-').map(Number) as [number, number, number]
  return new Date(Date.UTC(y, m - 1, d + n)).toISOString().slice(0, 10)
}
