import { computed, type ComputedRef } from 'vue'
import {
  formatQuantity,
  parseQuantityInput,
  toDisplay,
  unitLabel,
  type ParseResult,
  type Quantity,
  type UnitPrefs,
} from './displayUnits'
import { useUnits } from './useUnits'

/**
 * Display units for the vehicle and scenario screens, from the signed-in user's preferences
 * (`useUnits()`, accounts area). Adds what those screens need on top: reading typed input with an
 * optional unit ("68 F", "45 lb") and the thickness quantity.
 */
export interface DisplayUnits {
  prefs: ComputedRef<UnitPrefs>
  label: (q: Quantity) => string
  show: (q: Quantity, si: number | null | undefined, decimals?: number) => string
  toDisplay: (q: Quantity, si: number) => number
  parse: (q: Quantity, text: string) => ParseResult
}

export function useDisplayUnits(): DisplayUnits {
  const units = useUnits()
  const prefs = computed<UnitPrefs>(() => ({
    unitSystem: units.prefs.value.unitSystem,
    temperatureUnit: units.prefs.value.temperatureUnit,
  }))
  return {
    prefs,
    label: (q) => unitLabel(q, prefs.value),
    show: (q, si, decimals = 1) => formatQuantity(q, si, prefs.value, decimals),
    toDisplay: (q, si) => toDisplay(q, si, prefs.value),
    parse: (q, text) => parseQuantityInput(q, text, prefs.value),
  }
}
