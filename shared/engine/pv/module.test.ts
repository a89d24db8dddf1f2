import { describe, it } from 'vitest'
import { cellTempNoctC, pvwattsDcW } from './module.ts'
import { expectClose } from '../testing.ts'

describe('PV module temperature and power', () => {
  // Source: pvlib-python test_ross: ross(G=1000, Ta=30, NOCT=50) = 67.5 °C; (800, 20) → 50.0; (600, 40) → 62.5
  // (REFERENCES §4 [R]).
  it.each([
    [1000, 30, 67.5],
    [800, 20, 50.0],
    [600, 40, 62.5],
  ])('NOCT 50: G %d, Ta %d → %f °C (pvlib test_ross)', (g, ta, tc) => {
    expectClose(cellTempNoctC(g, ta, 50), tc, 1e-9)
  })

  // Source: REFERENCES §4 [C] pvlib pvwatts_dc(G 800, T_c 45, P0 200 W, γ −0.004) = 147.2 W.
  it('PVWatts DC: 800 W/m², 45 °C, 200 Wp, γ −0.004 gives 147.2 W', () => {
    expectClose(pvwattsDcW(800, 45, 200, -0.004), 147.2, 1e-9)
  })

  // Source: REFERENCES §4 [C]: P/P0 at 1000 W/m² with γ −0.0035 at 50 °C = 0.9125, at 0 °C = 1.0875.
  it('temperature coefficient: hot cells lose, cold cells gain', () => {
    expectClose(pvwattsDcW(1000, 50, 1, -0.0035), 0.9125, 1e-12)
    expectClose(pvwattsDcW(1000, 0, 1, -0.0035), 1.0875, 1e-12)
  })
})
