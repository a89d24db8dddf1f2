/**
 * Timestamps as battery monitors and BMS apps write them, and detection of which way a column writes them.
 * Times without a zone are read on the monitor's clock (`utcOffsetMinutes` east of UTC).
 */
import type { TimestampFormat } from './types.ts'

// 2026-01-15T08:30:00.250+01:00, 2026-01-15 08:30, 2026/01/15 08:30:00Z
const YMD =
  /^(\d{4})[-/.](\d{1,2})[-/.](\d{1,2})(?:[T ]+(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,6}))?)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/i
// 15/01/2026 08:30[:00][.250] [AM|PM]  (also with - or . between the date parts)
const DAY_FIRST_OR_MONTH_FIRST =
  /^(\d{1,2})[-/.](\d{1,2})[-/.](\d{4})(?:[T ,]+(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,6}))?)?\s*(AM|PM)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/i

const MS_PER_MIN = 60_000

function zoneOffsetMinutes(zone: string | undefined, fallback: number): number {
  if (!zone) return fallback
  if (zone === 'Z' || zone === 'z') return 0
  const sign = zone[0] === '-' ? -1 : 1
  const digits = zone.slice(1).replace(':', '')
  return sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2, 4)))
}

const MONTH_DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31]
function daysInMonth(y: number, mo: number): number {
  const leap = (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0
  return mo === 2 && leap ? 29 : MONTH_DAYS[mo - 1]!
}

function build(
  y: number,
  mo: number,
  d: number,
  h: number,
  mi: number,
  s: number,
  frac: string | undefined,
  offsetMin: number,
): number | null {
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 24 || mi > 59 || s > 60) return null
  // Reject 31 February and the like (no Date object per row: this runs for every sample).
  if (d > daysInMonth(y, mo)) return null
  const ms = frac ? Math.round(Number(`0.${frac}`) * 1000) : 0
  return Date.UTC(y, mo - 1, d, h, mi, s, ms) - offsetMin * MS_PER_MIN
}

/**
 * Parse one timestamp cell. Returns milliseconds since 1970 UTC, or null when the text does not fit the format.
 * @param utcOffsetMinutes - the monitor clock's offset from UTC, applied when the text carries no zone. [min]
 */
export function parseTimestampMs(
  text: string,
  format: TimestampFormat,
  utcOffsetMinutes: number,
): number | null {
  const s = text.trim()
  if (s === '') return null
  if (format === 'epoch-s' || format === 'epoch-ms') {
    if (!/^\d+(\.\d+)?$/.test(s)) return null
    const n = Number(s)
    return format === 'epoch-s' ? Math.round(n * 1000) : Math.round(n)
  }
  if (format === 'ymd') {
    const m = YMD.exec(s)
    if (!m) return null
    return build(
      Number(m[1]),
      Number(m[2]),
      Number(m[3]),
      Number(m[4] ?? 0),
      Number(m[5] ?? 0),
      Number(m[6] ?? 0),
      m[7],
      zoneOffsetMinutes(m[8], utcOffsetMinutes),
    )
  }
  const m = DAY_FIRST_OR_MONTH_FIRST.exec(s)
  if (!m) return null
  const [a, b] = [Number(m[1]), Number(m[2])]
  const [day, month] = format === 'dmy' ? [a, b] : [b, a]
  let hour = Number(m[4] ?? 0)
  const ampm = m[8]?.toUpperCase()
  if (ampm) {
    if (hour < 1 || hour > 12) return null
    hour = (hour % 12) + (ampm === 'PM' ? 12 : 0)
  }
  return build(
    Number(m[3]),
    month,
    day,
    hour,
    Number(m[5] ?? 0),
    Number(m[6] ?? 0),
    m[7],
    zoneOffsetMinutes(m[9], utcOffsetMinutes),
  )
}

/** Does the text carry its own zone (Z or ±hh:mm)? Then `utcOffsetMinutes` only cuts days. */
export function hasExplicitZone(text: string): boolean {
  return /(Z|[+-]\d{2}:?\d{2})$/i.test(text.trim()) && !/^\d+(\.\d+)?$/.test(text.trim())
}

export interface TimestampDetection {
  format: TimestampFormat
  /** true when day/month order could not be told apart from the values (all parts ≤ 12). */
  ambiguous: boolean
  /** The offset written in the values themselves, when they carry one. [min] */
  explicitOffsetMinutes: number | null
}

const EPOCH_S_MIN = 946_684_800 // 2000-01-01
const EPOCH_S_MAX = 4_102_444_800 // 2100-01-01

/**
 * Which format do these (non-empty) values use? Returns null when none fits most of them.
 * Day-first vs month-first: a part above 12 decides; otherwise the order under which time runs forward wins,
 * and day-first wins a tie (it is the more common order outside the United States).
 */
export function detectTimestampFormat(values: readonly string[]): TimestampDetection | null {
  const vals = values.map((v) => v.trim()).filter((v) => v !== '')
  if (vals.length === 0) return null
  const fits = (f: TimestampFormat) => vals.filter((v) => parseTimestampMs(v, f, 0) !== null).length
  const enough = (n: number) => n >= Math.max(1, Math.ceil(vals.length * 0.9))
  const zone = vals.find(hasExplicitZone)
  const explicitOffsetMinutes = zone ? zoneOffsetMinutes(/(Z|[+-]\d{2}:?\d{2})$/i.exec(zone)?.[1], 0) : null

  if (vals.every((v) => /^\d+(\.\d+)?$/.test(v))) {
    const n = Number(vals[0])
    if (n >= EPOCH_S_MIN && n < EPOCH_S_MAX)
      return { format: 'epoch-s', ambiguous: false, explicitOffsetMinutes }
    if (n >= EPOCH_S_MIN * 1000 && n < EPOCH_S_MAX * 1000)
      return { format: 'epoch-ms', ambiguous: false, explicitOffsetMinutes }
    return null
  }
  if (enough(fits('ymd'))) return { format: 'ymd', ambiguous: false, explicitOffsetMinutes }

  const parts = vals
    .map((v) => DAY_FIRST_OR_MONTH_FIRST.exec(v))
    .filter((m): m is RegExpExecArray => m !== null)
  if (!enough(parts.length)) return null
  const firstAbove12 = parts.some((m) => Number(m[1]) > 12)
  const secondAbove12 = parts.some((m) => Number(m[2]) > 12)
  if (firstAbove12 && !secondAbove12) return { format: 'dmy', ambiguous: false, explicitOffsetMinutes }
  if (secondAbove12 && !firstAbove12) return { format: 'mdy', ambiguous: false, explicitOffsetMinutes }
  const backwards = (f: TimestampFormat) => {
    let count = 0
    let prev = -Infinity
    for (const v of vals) {
      const t = parseTimestampMs(v, f, 0)
      if (t === null) continue
      if (t < prev) count++
      prev = t
    }
    return count
  }
  const [dmyBack, mdyBack] = [backwards('dmy'), backwards('mdy')]
  return {
    format: mdyBack < dmyBack ? 'mdy' : 'dmy',
    ambiguous: dmyBack === mdyBack,
    explicitOffsetMinutes,
  }
}

/** YYYY-MM-DD of an instant on a clock `utcOffsetMinutes` east of UTC. */
export function localDate(tsMs: number, utcOffsetMinutes: number): string {
  return new Date(tsMs + utcOffsetMinutes * MS_PER_MIN).toISOString().slice(0, 10)
}

/** The instant the local day of `tsMs` ends (next local midnight). */
export function nextLocalMidnightMs(tsMs: number, utcOffsetMinutes: number): number {
  const shifted = tsMs + utcOffsetMinutes * MS_PER_MIN
  const dayMs = 86_400_000
  return (Math.floor(shifted / dayMs) + 1) * dayMs - utcOffsetMinutes * MS_PER_MIN
}
