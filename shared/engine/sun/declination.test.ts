import { describe, it } from 'vitest'
import {
  declinationCooper1969Rad,
  declinationSpencer1971Rad,
  equationOfTimeSpencer1971Min,
} from './declination.ts'
import { expectClose } from '../testing.ts'

const DEG = 180 / Math.PI

describe('declination and equation of time', () => {
  // Source: Duffie & Beckman, Solar Engineering of Thermal Processes, Table 1.6.1 "recommended average days"
  // (book table from memory [M]; values reproduced with Cooper's equation, REFERENCES §1.4 [C]). Tolerance 0.05°.
  it.each([
    [17, -20.9],
    [47, -13.0],
    [75, -2.4],
    [105, 9.4],
    [162, 23.1],
    [198, 21.2],
    [258, 2.2],
    [344, -23.0],
  ])('Cooper δ for n = %d is %f° (D&B Table 1.6.1)', (n, deg) => {
    expectClose(declinationCooper1969Rad(n) * DEG, deg, 0.05)
  })

  // Source: NOAA/Spencer series values at 12:00 UTC, REFERENCES §1.4 [C] (same series; at noon NOAA's γ = 2π(n−1)/365).
  it.each([
    [17, -20.9036],
    [172, 23.452],
    [355, -23.4199],
  ])('Spencer δ for n = %d is %f°', (n, deg) => {
    expectClose(declinationSpencer1971Rad(n) * DEG, deg, 0.002)
  })

  // Source: NREL SPA apparent declination, REFERENCES §1.4 [C]: Spencer within ±0.5° of SPA.
  it('Spencer δ is within 0.5° of NREL SPA on the solstices and equinoxes', () => {
    expectClose(declinationSpencer1971Rad(172.5) * DEG, 23.4379, 0.5)
    expectClose(declinationSpencer1971Rad(79.5) * DEG, -0.0454, 0.5)
    expectClose(declinationSpencer1971Rad(355.5) * DEG, -23.4369, 0.5)
  })

  // Source: Duffie & Beckman Example 1.5.1 (book answer from memory [M], recomputed [C] in REFERENCES §1.5):
  // Madison, 3 February (n = 34): E = −13.5 min. Tolerance 0.5 min.
  it('equation of time on 3 February is −13.5 min (D&B Ex. 1.5.1)', () => {
    expectClose(equationOfTimeSpencer1971Min(34), -13.5, 0.5)
  })
})
