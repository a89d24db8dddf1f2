import { computed, ref, type ComputedRef } from 'vue'
import {
  DEFAULT_UNIT_PREFS,
  formatQuantity,
  parseQuantityInput,
  toDisplay,
  unitLabel,
  type ParseResult,
  type Quantity,
  type UnitPrefs,
} from './displayUnits'

/**
 * Local adapter for the user's unit preferences, used by the vehicle and scenario screens.
 * The accounts area's `useUnits()` (src/composables/useUnits.ts) will own the signed-in user's
 * preferences; until it lands, the preferences live here (metric and °C unless `setDisplayUnitPrefs`
 * is called). Switching means changing `prefs` below to read from it; callers stay the same.
 */
const localPrefs = ref<UnitPrefs>({ ...DEFAULT_UNIT_PREFS })

export function setDisplayUnitPrefs(p: Partial<UnitPrefs>): void {
  localPrefs.value = { ...localPrefs.value, ...p }
}

export interface DisplayUnits {
  prefs: ComputedRef<UnitPrefs>
  label: (q: Quantity) => string
  show: (q: Quantity, si: number | null | undefined, decimals?: number) => string
  toDisplay: (q: Quantity, si: number) => number
  parse: (q: Quantity, text: string) => ParseResult
}

export function useDisplayUnits(): DisplayUnits {
  const prefs = computed(() => localPrefs.value)
  return {
    prefs,
    label: (q) => unitLabel(q, prefs.value),
    show: (q, si, decimals = 1) => formatQuantity(q, si, prefs.value, decimals),
    toDisplay: (q, si) => toDisplay(q, si, prefs.value),
    parse: (q, text) => parseQuantityInput(q, text, prefs.value),
  }
}
