import { describe, it, expect } from 'vitest'
import { peukertExponentFromTests, peukertFactor, peukertRuntimeH } from './peukert.ts'
import { chargeTaperFactor, oneWayEfficiency, packNominalVoltageV } from './charge.ts'
import { expectClose } from '../testing.ts'

describe("Peukert's law", () => {
  // Source: REFERENCES §5.2 [C], t = H (C/(I H))^k with C20 = 100 Ah. Tolerance 1e-3 relative.
  it.each([
    [1.05, 10, 9.659],
    [1.15, 20, 4.061],
    [1.25, 50, 1.125],
    [1.3, 100, 0.407],
    [1.0, 50, 2.0],
  ])('k %f at %d A runs %f h', (k, amps, hours) => {
    expectClose(peukertRuntimeH(100, 20, amps, k), hours, hours * 1e-3)
  })

  // Source: REFERENCES §5.2 [C]: I_eff for k = 1.15 at 20 A on C20 = 100 Ah is 24.62 A.
  it('effective current for k 1.15 at 20 A is 24.62 A', () => {
    expectClose(20 * peukertFactor(100, 20, 20, 1.15), 24.62, 0.01)
  })

  // Source: REFERENCES §5.2 [C]: 5 A for 20 h and 20 A for 4.0 h give k = 1.1610.
  it('two-test fit gives k = 1.1610', () => {
    expectClose(peukertExponentFromTests(5, 20, 20, 4.0), 1.161, 1e-3)
  })

  it('is not applied below the rated current (our choice; common practice, no source)', () => {
    expect(peukertFactor(100, 20, 2, 1.25)).toBe(1)
  })
})

describe('pack rules', () => {
  // Trade rule of thumb: 4 LFP cells of 3.2 V nominal give 12.8 V. Common practice, no source.
  it('4 LFP cells of 3.2 V nominal give 12.8 V (common practice, no source)', () => {
    expectClose(packNominalVoltageV(4, 3.2), 12.8, 1e-12)
  })
  it('splits round-trip efficiency evenly (energy balance)', () => {
    expectClose(oneWayEfficiency(0.81) ** 2, 0.81, 1e-12)
  })
  it('tapers lead-acid charge acceptance linearly to zero at the ceiling (common practice, no source)', () => {
    expect(chargeTaperFactor(0.7, 0.8, 1)).toBe(1)
    expectClose(chargeTaperFactor(0.9, 0.8, 1), 0.5, 1e-12)
    expect(chargeTaperFactor(1, 0.8, 1)).toBe(0)
    expect(chargeTaperFactor(0.99, 1, 1)).toBe(1)
  })
})
