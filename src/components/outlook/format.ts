/**
 * Key-figure formatting for the Outlook and Side by side screens: every figure with its unit, rounded for
 * reading (not for arithmetic), in the user's temperature and mass units. Pure functions.
 *
 * Energy, charge and power stay SI everywhere (Wh/kWh, Ah, Wp, W): imperial users plan DC systems in the
 * same units. Temperature follows the °C/°F preference; mass follows metric/imperial.
 */
import type { UnitPrefs } from '../../composables/displayUnits'
import { tripMoment } from '@shared/engine/results'

const MINUS = '\u2212'
const LB_PER_KG = 1 / 0.45359237 // international avoirdupois pound, exact by definition (1959)

/**
 * One Intl.NumberFormat per number of decimals: building one per call (what toLocaleString with options
 * does) cost ~0.1 ms each and dominated a what-if move, since chart axes format their ticks many times.
 */
const FORMATS = new Map<number, Intl.NumberFormat>()
function numberFormat(decimals: number): Intl.NumberFormat {
  let f = FORMATS.get(decimals)
  if (!f) {
    f = new Intl.NumberFormat('en-GB', { minimumFractionDigits: decimals, maximumFractionDigits: decimals })
    FORMATS.set(decimals, f)
  }
  return f
}

/** A number with thousands separators and the typographic minus. */
export function formatNumber(v: number, decimals = 0): string {
  const f = 10 ** decimals
  const r = Math.round(v * f) / f
  return numberFormat(decimals)
    .format(Object.is(r, -0) ? 0 : r)
    .replace('-', MINUS)
}

const missing = (v: number | null | undefined): v is null | undefined =>
  v === null || v === undefined || !Number.isFinite(v)

/** Energy: below 1 kWh in Wh (whole), then kWh with 1 decimal (whole from 100 kWh). */
export function formatEnergy(wh: number | null | undefined): string {
  if (missing(wh)) return '—'
  const abs = Math.abs(wh)
  if (abs < 999.5) return `${formatNumber(wh)} Wh`
  const kwh = wh / 1000
  return `${formatNumber(kwh, Math.abs(kwh) >= 99.95 ? 0 : 1)} kWh`
}

/** Energy in Wh, whole, for tables that must line up. */
export function formatWh(wh: number | null | undefined): string {
  return missing(wh) ? '—' : `${formatNumber(wh)} Wh`
}

export function formatAh(ah: number | null | undefined): string {
  return missing(ah) ? '—' : `${formatNumber(ah)} Ah`
}

export function formatWp(wp: number | null | undefined): string {
  return missing(wp) ? '—' : `${formatNumber(wp)} Wp`
}

export function formatHours(h: number | null | undefined): string {
  if (missing(h)) return '—'
  return `${formatNumber(h, Number.isInteger(h) ? 0 : 1)} h`
}

/** Days with one decimal below 10, whole above; "1 day", "0.5 days". */
export function formatDays(days: number | null | undefined): string {
  if (missing(days)) return '—'
  const text = formatNumber(days, days < 9.95 ? 1 : 0).replace(/\.0$/, '')
  return `${text} ${text === '1' ? 'day' : 'days'}`
}

/** State of charge (0–1) as a whole percentage: 0.234 → "23 %". */
export function formatPercent(fraction: number | null | undefined): string {
  return missing(fraction) ? '—' : `${formatNumber(fraction * 100)} %`
}

/** A temperature stored in °C, shown in the user's unit, whole degrees: −6 °C, 21 °F. */
export function formatTemperature(c: number | null | undefined, prefs: UnitPrefs, decimals = 0): string {
  if (missing(c)) return '—'
  if (prefs.temperatureUnit === 'F') return `${formatNumber((c * 9) / 5 + 32, decimals)} °F`
  return `${formatNumber(c, decimals)} °C`
}

export function temperatureToDisplay(c: number, prefs: UnitPrefs): number {
  return prefs.temperatureUnit === 'F' ? (c * 9) / 5 + 32 : c
}
export function temperatureFromDisplay(v: number, prefs: UnitPrefs): number {
  return prefs.temperatureUnit === 'F' ? ((v - 32) * 5) / 9 : v
}
export function temperatureUnitLabel(prefs: UnitPrefs): string {
  return prefs.temperatureUnit === 'F' ? '°F' : '°C'
}

/** Mass stored in kg: 22 kg, 49 lb. */
export function formatMass(kg: number | null | undefined, prefs: UnitPrefs): string {
  if (missing(kg)) return '—'
  if (prefs.unitSystem === 'imperial') return `${formatNumber(kg * LB_PER_KG)} lb`
  return `${formatNumber(kg)} kg`
}

/** "day 4 at 06:00": the end of an hour of the run (shared/engine/results.ts `tripMoment`, also the report's). */
export const formatTripMoment = tripMoment

/** The hour itself, for tables: "Day 4, 05:00–06:00" (the last one of a day ends at 24:00). */
export function formatTripHour(hourIndex: number): string {
  const day = Math.floor(hourIndex / 24) + 1
  const h = hourIndex % 24
  return `Day ${day}, ${String(h).padStart(2, '0')}:00–${String(h + 1).padStart(2, '0')}:00`
}

/** Money with a currency code: "1,240 EUR" (whole units; plan prices are rough). */
export function formatMoney(v: number | null | undefined, currency = ''): string {
  if (missing(v)) return '—'
  return currency ? `${formatNumber(v)} ${currency}` : formatNumber(v)
}
