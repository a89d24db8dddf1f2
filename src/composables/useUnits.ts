import { computed, type ComputedRef } from 'vue'
import { useAuthStore } from '../stores/auth'

/**
 * The signed-in user's display units, and pure conversions from the SI values we store.
 * Conversion factors are exact by definition (NIST SP 811, 2008 ed., appendix B.8/B.9):
 *   1 ft = 0.3048 m, 1 lb = 0.45359237 kg, 1 ft² = 0.09290304 m², °F = °C × 9/5 + 32.
 */

export type UnitSystem = 'metric' | 'imperial'
export type TemperatureUnit = 'C' | 'F'
export interface UnitPrefs {
  unitSystem: UnitSystem
  temperatureUnit: TemperatureUnit
  currency: string
}
export const DEFAULT_PREFS: UnitPrefs = { unitSystem: 'metric', temperatureUnit: 'C', currency: 'EUR' }

export type Quantity = 'temperature' | 'length' | 'mass' | 'area'

const M_PER_FT = 0.3048
const KG_PER_LB = 0.45359237
const M2_PER_FT2 = 0.09290304

/** The display unit's label for a quantity. */
export function unitLabel(q: Quantity, p: UnitPrefs): string {
  switch (q) {
    case 'temperature':
      return p.temperatureUnit === 'F' ? '°F' : '°C'
    case 'length':
      return p.unitSystem === 'imperial' ? 'ft' : 'm'
    case 'mass':
      return p.unitSystem === 'imperial' ? 'lb' : 'kg'
    case 'area':
      return p.unitSystem === 'imperial' ? 'ft²' : 'm²'
  }
}

/** SI value (°C, m, kg, m²) → the number in the user's unit. */
export function fromSi(q: Quantity, si: number, p: UnitPrefs): number {
  switch (q) {
    case 'temperature':
      return p.temperatureUnit === 'F' ? (si * 9) / 5 + 32 : si
    case 'length':
      return p.unitSystem === 'imperial' ? si / M_PER_FT : si
    case 'mass':
      return p.unitSystem === 'imperial' ? si / KG_PER_LB : si
    case 'area':
      return p.unitSystem === 'imperial' ? si / M2_PER_FT2 : si
  }
}

/** A number typed in the user's unit → SI (for inputs). */
export function toSi(q: Quantity, shown: number, p: UnitPrefs): number {
  switch (q) {
    case 'temperature':
      return p.temperatureUnit === 'F' ? ((shown - 32) * 5) / 9 : shown
    case 'length':
      return p.unitSystem === 'imperial' ? shown * M_PER_FT : shown
    case 'mass':
      return p.unitSystem === 'imperial' ? shown * KG_PER_LB : shown
    case 'area':
      return p.unitSystem === 'imperial' ? shown * M2_PER_FT2 : shown
  }
}

/** "−6 °C", "21.2 °F", "12.5 kg": fixed decimals, a real minus sign, a narrow no-break space before the unit. */
export function formatQuantity(
  q: Quantity,
  si: number | null | undefined,
  p: UnitPrefs,
  decimals = 1,
): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return '–'
  const v = fromSi(q, si, p)
  const rounded = Number(v.toFixed(decimals))
  const text = Math.abs(rounded).toFixed(decimals)
  const sign = rounded < 0 ? '−' : ''
  return `${sign}${text}\u202f${unitLabel(q, p)}`
}

/** Money in the user's currency (display only; amounts stay exact decimals elsewhere). */
export function formatMoney(amount: number | string, p: UnitPrefs, locale?: string): string {
  const n = typeof amount === 'string' ? Number(amount) : amount
  return new Intl.NumberFormat(locale, { style: 'currency', currency: p.currency }).format(n)
}

export interface Units {
  prefs: ComputedRef<UnitPrefs>
  label: (q: Quantity) => string
  show: (q: Quantity, si: number | null | undefined, decimals?: number) => string
  fromSi: (q: Quantity, si: number) => number
  toSi: (q: Quantity, shown: number) => number
  money: (amount: number | string) => string
}

/** The signed-in user's units (metric, °C and EUR when signed out). */
export function useUnits(): Units {
  const auth = useAuthStore()
  const prefs = computed<UnitPrefs>(() =>
    auth.user
      ? {
          unitSystem: auth.user.unitSystem,
          temperatureUnit: auth.user.temperatureUnit,
          currency: auth.user.currency,
        }
      : DEFAULT_PREFS,
  )
  return {
    prefs,
    label: (q) => unitLabel(q, prefs.value),
    show: (q, si, decimals) => formatQuantity(q, si, prefs.value, decimals),
    fromSi: (q, si) => fromSi(q, si, prefs.value),
    toSi: (q, shown) => toSi(q, shown, prefs.value),
    money: (amount) => formatMoney(amount, prefs.value),
  }
}
