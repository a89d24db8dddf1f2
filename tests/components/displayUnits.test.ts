import { describe, expect, it } from 'vitest'
import {
  formatQuantity,
  fromDisplay,
  parseQuantityInput,
  toDisplay,
} from '../../src/composables/displayUnits'

const metric = { unitSystem: 'metric', temperatureUnit: 'C' } as const
const imperial = { unitSystem: 'imperial', temperatureUnit: 'F' } as const

// Conversion factors are exact by definition: NIST SP 811 (2008 ed.), appendix B.8/B.9 —
// 1 lb = 0.45359237 kg, 1 in = 0.0254 m, 1 ft² = 0.09290304 m², t/°F = 1.8·t/°C + 32.
describe('display units', () => {
  it('shows SI values in the chosen units', () => {
    expect(toDisplay('temperature', 0, imperial)).toBe(32)
    expect(toDisplay('temperature', -40, imperial)).toBeCloseTo(-40, 12)
    expect(toDisplay('mass', 0.45359237, imperial)).toBeCloseTo(1, 12)
    expect(toDisplay('thickness', 0.0254, imperial)).toBeCloseTo(1, 12)
    expect(toDisplay('area', 0.09290304, imperial)).toBeCloseTo(1, 12)
    expect(toDisplay('thickness', 0.025, metric)).toBeCloseTo(25, 12)
  })

  it('round-trips every quantity', () => {
    for (const q of ['temperature', 'mass', 'thickness', 'area'] as const) {
      for (const p of [metric, imperial])
        expect(fromDisplay(q, toDisplay(q, 12.3, p), p)).toBeCloseTo(12.3, 10)
    }
  })

  it('reads input in either unit and stores SI', () => {
    expect(parseQuantityInput('temperature', '95 F', metric)).toEqual({ ok: true, si: 35 })
    expect(parseQuantityInput('temperature', '−5 °C', imperial)).toEqual({ ok: true, si: -5 })
    expect(parseQuantityInput('temperature', '68', imperial)).toEqual({ ok: true, si: 20 })
    const lb = parseQuantityInput('mass', '10 lb', metric)
    expect(lb.ok && lb.si).toBeCloseTo(4.5359237, 10)
    expect(parseQuantityInput('mass', '2,5', metric)).toEqual({ ok: true, si: 2.5 })
    expect(parseQuantityInput('mass', '', metric)).toEqual({ ok: true, si: null })
  })

  it('names what is wrong with bad input', () => {
    expect(parseQuantityInput('temperature', 'warm', metric)).toEqual({
      ok: false,
      message: 'must be a number',
    })
    const r = parseQuantityInput('mass', '3 stone', metric)
    expect(r.ok).toBe(false)
    expect(!r.ok && r.message).toContain('kg or lb')
  })

  it('formats with a real minus sign and the unit', () => {
    expect(formatQuantity('temperature', -6, metric, 0)).toBe('−6 °C')
    expect(formatQuantity('temperature', null, metric)).toBe('—')
  })
})
