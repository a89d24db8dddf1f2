/**
 * Display units for the vehicle and scenario screens: values are stored in SI and shown in the
 * user's choice (metric/imperial, °C/°F). Input is accepted in either: a bare number is read in the
 * display unit, a number with a unit ("68 F", "20 °C", "45 lb", "1 in") in that unit.
 *
 * Pure functions; `useDisplayUnits()` (useDisplayUnits.ts) supplies the signed-in user's preferences
 * from `useUnits()`. Conversion factors are exact by definition (NIST SP 811, 2008 ed., appendix B).
 */

export type UnitSystem = 'metric' | 'imperial'
export type TemperatureUnit = 'C' | 'F'
export interface UnitPrefs {
  unitSystem: UnitSystem
  temperatureUnit: TemperatureUnit
}
export const DEFAULT_UNIT_PREFS: UnitPrefs = { unitSystem: 'metric', temperatureUnit: 'C' }

/** Quantities the screens show in the user's units. SI: °C, kg, m (thickness), m² (area). */
export type Quantity = 'temperature' | 'mass' | 'thickness' | 'area'

interface UnitDef {
  /** Label shown after the number. */
  label: string
  /** What a user may type after the number (lower case, spaces removed). */
  aliases: string[]
  toSi: (v: number) => number
  fromSi: (si: number) => number
}

const LB_PER_KG = 1 / 0.45359237 // international avoirdupois pound, exact by definition (1959)
const M_PER_IN = 0.0254 // exact by definition (1959)
const M2_PER_FT2 = 0.09290304 // (0.3048 m)², exact

const UNITS: Record<Quantity, { metric: UnitDef; imperial: UnitDef }> = {
  temperature: {
    metric: {
      label: '°C',
      aliases: ['c', '°c', 'degc', 'celsius'],
      toSi: (v) => v,
      fromSi: (c) => c,
    },
    imperial: {
      label: '°F',
      aliases: ['f', '°f', 'degf', 'fahrenheit'],
      toSi: (f) => ((f - 32) * 5) / 9,
      fromSi: (c) => (c * 9) / 5 + 32,
    },
  },
  mass: {
    metric: { label: 'kg', aliases: ['kg', 'kgs'], toSi: (v) => v, fromSi: (v) => v },
    imperial: {
      label: 'lb',
      aliases: ['lb', 'lbs', 'pound', 'pounds'],
      toSi: (lb) => lb / LB_PER_KG,
      fromSi: (kg) => kg * LB_PER_KG,
    },
  },
  thickness: {
    metric: { label: 'mm', aliases: ['mm'], toSi: (mm) => mm / 1000, fromSi: (m) => m * 1000 },
    imperial: {
      label: 'in',
      aliases: ['in', 'inch', 'inches', '"'],
      toSi: (inch) => inch * M_PER_IN,
      fromSi: (m) => m / M_PER_IN,
    },
  },
  area: {
    metric: { label: 'm²', aliases: ['m²', 'm2', 'sqm'], toSi: (v) => v, fromSi: (v) => v },
    imperial: {
      label: 'ft²',
      aliases: ['ft²', 'ft2', 'sqft'],
      toSi: (ft2) => ft2 * M2_PER_FT2,
      fromSi: (m2) => m2 / M2_PER_FT2,
    },
  },
}

/** Which of the two systems applies to a quantity: temperature follows its own preference. */
function systemFor(q: Quantity, prefs: UnitPrefs): 'metric' | 'imperial' {
  if (q === 'temperature') return prefs.temperatureUnit === 'F' ? 'imperial' : 'metric'
  return prefs.unitSystem
}

export function unitLabel(q: Quantity, prefs: UnitPrefs): string {
  return UNITS[q][systemFor(q, prefs)].label
}

export function toDisplay(q: Quantity, si: number, prefs: UnitPrefs): number {
  return UNITS[q][systemFor(q, prefs)].fromSi(si)
}

export function fromDisplay(q: Quantity, value: number, prefs: UnitPrefs): number {
  return UNITS[q][systemFor(q, prefs)].toSi(value)
}

/** Rounds to a number of decimals for display. */
export function roundForDisplay(v: number, decimals = 1): number {
  const f = 10 ** decimals
  return Math.round(v * f) / f
}

export function formatQuantity(q: Quantity, si: number | null | undefined, prefs: UnitPrefs, decimals = 1) {
  if (si === null || si === undefined || !Number.isFinite(si)) return '—'
  const v = roundForDisplay(toDisplay(q, si, prefs), decimals)
  return `${v.toLocaleString('en-GB').replace('-', '−')} ${unitLabel(q, prefs)}`
}

export type ParseResult = { ok: true; si: number | null } | { ok: false; message: string }

/**
 * Reads what the user typed. Empty → null. "20" → display unit. "68 F" / "-5°C" / "45 lb" → that unit.
 * Accepts a comma as decimal separator and the typographic minus.
 */
export function parseQuantityInput(q: Quantity, text: string, prefs: UnitPrefs): ParseResult {
  const t = text
    .trim()
    .replace(/\u2212/g, '-')
    .replace(',', '.')
  if (t === '') return { ok: true, si: null }
  const m = /^([-+]?\d*\.?\d+(?:e[-+]?\d+)?)\s*(.*)$/i.exec(t)
  if (!m) return { ok: false, message: 'must be a number' }
  const value = Number(m[1])
  const suffix = (m[2] ?? '').toLowerCase().replace(/\s+/g, '')
  if (!Number.isFinite(value)) return { ok: false, message: 'must be a number' }
  if (suffix === '') return { ok: true, si: fromDisplay(q, value, prefs) }
  for (const sys of ['metric', 'imperial'] as const) {
    const def = UNITS[q][sys]
    if (def.aliases.includes(suffix)) return { ok: true, si: def.toSi(value) }
  }
  const both = `${UNITS[q].metric.label} or ${UNITS[q].imperial.label}`
  return { ok: false, message: `unknown unit "${m[2]}": use ${both}` }
}
