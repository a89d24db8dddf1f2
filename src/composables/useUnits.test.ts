import { describe, it, expect } from 'vitest'
import {
  DEFAULT_PREFS,
  formatMoney,
  formatQuantity,
  fromSi,
  toSi,
  unitLabel,
  type UnitPrefs,
} from './useUnits'

const metric: UnitPrefs = DEFAULT_PREFS
const imperial: UnitPrefs = { unitSystem: 'imperial', temperatureUnit: 'F', currency: 'USD' }

describe('useUnits conversions (NIST SP 811, 2008 ed., appendix B: exact factors)', () => {
  it('temperature: 0 °C = 32 °F, 100 °C = 212 °F, −40 is the same on both scales', () => {
    expect(fromSi('temperature', 0, imperial)).toBe(32)
    expect(fromSi('temperature', 100, imperial)).toBe(212)
    expect(fromSi('temperature', -40, imperial)).toBe(-40)
    expect(toSi('temperature', 212, imperial)).toBe(100)
    expect(fromSi('temperature', 5, metric)).toBe(5)
  })

  it('length: 0.3048 m = 1 ft; mass: 0.45359237 kg = 1 lb; area: 0.09290304 m² = 1 ft²', () => {
    expect(fromSi('length', 0.3048, imperial)).toBeCloseTo(1, 12)
    expect(fromSi('mass', 0.45359237, imperial)).toBeCloseTo(1, 12)
    expect(fromSi('area', 0.09290304, imperial)).toBeCloseTo(1, 12)
    expect(toSi('mass', 100, imperial)).toBeCloseTo(45.359237, 9)
    expect(fromSi('mass', 12, metric)).toBe(12)
  })

  it('round-trips every quantity', () => {
    for (const q of ['temperature', 'length', 'mass', 'area'] as const) {
      for (const v of [-12.5, 0, 3.7, 1000])
        expect(toSi(q, fromSi(q, v, imperial), imperial)).toBeCloseTo(v, 9)
    }
  })

  it('labels follow the preference', () => {
    expect(unitLabel('temperature', imperial)).toBe('°F')
    expect(unitLabel('temperature', { ...metric, temperatureUnit: 'F' })).toBe('°F')
    expect(unitLabel('area', imperial)).toBe('ft²')
    expect(unitLabel('length', metric)).toBe('m')
  })

  it('formats with a real minus sign, fixed decimals and the unit', () => {
    expect(formatQuantity('temperature', -6, metric, 0)).toBe('−6\u202f°C')
    expect(formatQuantity('temperature', -6, imperial, 1)).toBe('21.2\u202f°F')
    expect(formatQuantity('mass', 31.5, imperial, 1)).toBe('69.4\u202flb')
    expect(formatQuantity('temperature', -0.01, metric, 1)).toBe('0.0\u202f°C') // no "−0.0"
    expect(formatQuantity('mass', null, metric)).toBe('–')
  })

  it('formats money in the chosen currency', () => {
    expect(formatMoney(1234.5, imperial, 'en-US')).toBe('$1,234.50')
    expect(formatMoney('99.90', metric, 'en-GB')).toBe('€99.90')
  })
})
