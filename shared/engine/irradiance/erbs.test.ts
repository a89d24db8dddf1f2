import { describe, it, expect } from 'vitest'
import { diffuseFractionErbs1982, splitErbs1982 } from './erbs.ts'
import { extraterrestrialNormalSpencerWPerM2 } from './extraterrestrial.ts'
import { expectClose } from '../testing.ts'

describe('Erbs et al. (1982) diffuse fraction', () => {
  // Source: Erbs, Klein & Duffie 1982 eq. 1, values computed from the published formula (REFERENCES §2.5 [C]).
  // Tolerance 5e-4 (the published pieces do not meet exactly at the breakpoints).
  it.each([
    [0.1, 0.991],
    [0.22, 0.9802],
    [0.3, 0.9486],
    [0.4, 0.84],
    [0.5, 0.6591],
    [0.6, 0.4395],
    [0.7, 0.244],
    [0.75, 0.1831],
    [0.8, 0.1653],
    [0.9, 0.165],
  ])('kt %f → kd %f', (kt, kd) => {
    expectClose(diffuseFractionErbs1982(kt), kd, 5e-4)
  })

  // Source: pvlib-python tests/test_irradiance.py::test_erbs (REFERENCES §2.5 [R]); pvlib forms kt with
  // get_extra_radiation (Spencer, G_sc 1366.1) for the timestamp's day. Compared to 1e-4 relative.
  it.each([
    [50, 85, 1, 96.7192672, 41.5703604, 0.405723511],
    [1000, 10, 1, 794.205651, 217.860117, 0.718132729],
    [1000, 10, 171, 842.001578, 170.790318, 0.768214312],
  ])('GHI %d, zenith %d, day %d → DNI %f, DHI %f (pvlib test_erbs)', (ghi, zen, n, dni, dhi, kt) => {
    const r = splitErbs1982(ghi, zen, extraterrestrialNormalSpencerWPerM2(n, 1366.1))
    expectClose(r.clearnessIndex, kt, kt * 1e-4)
    expectClose(r.dniWPerM2, dni, dni * 1e-4)
    expectClose(r.dhiWPerM2, dhi, dhi * 1e-4)
  })

  it('gives no beam with the sun below the horizon (pvlib test_erbs: GHI 0, zenith 120)', () => {
    const r = splitErbs1982(0, 120, 1400)
    expect(r.dniWPerM2).toBe(0)
    expect(r.dhiWPerM2).toBe(0)
  })
})
