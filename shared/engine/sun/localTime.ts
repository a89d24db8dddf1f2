/**
 * Local clock from an IANA time zone, with the platform's Intl.DateTimeFormat (browsers and Node alike).
 */

const formatters = new Map<string, Intl.DateTimeFormat>()

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone)
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: 'numeric',
      day: 'numeric',
      hour: 'numeric',
      minute: 'numeric',
      second: 'numeric',
    })
    formatters.set(timeZone, f)
  }
  return f
}

/**
 * Offset of the zone's local clock from UTC at an instant (local − UTC), including daylight saving.
 * @returns [min]
 */
export function utcOffsetMin(epochMs: number, timeZone: string): number {
  const parts = formatterFor(timeZone).formatToParts(new Date(epochMs))
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value ?? 0)
  const asUtc = Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'), get('second'))
  return Math.round((asUtc - Math.floor(epochMs / 1000) * 1000) / 60_000)
}

/**
 * The UTC instant of local midnight starting a calendar day, `dayOffset` days after `isoDate`.
 * The offset is taken at local noon of that day, so a daylight-saving change at night shifts
 * that day's hours by one hour at most (hourly steps keep 24 per day).
 * @returns [ms since epoch]
 */
export function localMidnightUtcMs(isoDate: string, dayOffset: number, timeZone: string): number {
  const [y, m, d] = isoDate.split('-').map(Number) as [number, number, number]
  const noonAsUtc = Date.UTC(y, m - 1, d + dayOffset, 12)
  const offsetMin = utcOffsetMin(noonAsUtc, timeZone)
  return Date.UTC(y, m - 1, d + dayOffset) - offsetMin * 60_000
}
