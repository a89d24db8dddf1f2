import { describe, it, expect } from 'vitest'
import { clearSkyGhiHaurwitzWPerM2 } from './clearSky.ts'
import { expectClose } from '../testing.ts'

describe('Haurwitz clear-sky GHI', () => {
  // Source: pvlib-python tests/test_clearsky.py::test_haurwitz expected values (REFERENCES §2.3 [R]),
  // inputs as apparent elevation; tolerance 1e-6 W/m².
  it.each([
    [5, 48.6298687941956],
    [10, 135.741748091813],
    [30, 487.894132885425],
    [50, 778.766689344363],
    [90, 1035.0920325345],
  ])('elevation %d° gives %f W/m² (pvlib test_haurwitz)', (elev, ghi) => {
    expectClose(clearSkyGhiHaurwitzWPerM2(90 - elev), ghi, 1e-6)
  })

  it('is zero with the sun at or below the horizon (pvlib test_haurwitz: 0 for elevation ≤ 0)', () => {
    expect(clearSkyGhiHaurwitzWPerM2(90)).toBe(0)
    expect(clearSkyGhiHaurwitzWPerM2(100)).toBe(0)
  })
})
