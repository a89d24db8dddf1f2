import { describe, it } from 'vitest'
import { cosAngleOfIncidence, planeOfArrayIsotropicWPerM2 } from './transposition.ts'
import { expectClose } from '../testing.ts'

describe('isotropic-sky transposition (Liu & Jordan)', () => {
  // Source: pvlib-python test: isotropic(surface_tilt=40, dhi=100) = 88.30222215594891 (REFERENCES §2.6 [R]).
  it('sky diffuse on a 40° tilt with DHI 100 is 88.302 W/m² (pvlib)', () => {
    const poa = planeOfArrayIsotropicWPerM2({
      dniWPerM2: 0,
      dhiWPerM2: 100,
      ghiWPerM2: 0,
      zenithDeg: 30,
      sunAzimuthDeg: 180,
      tiltDeg: 40,
      surfaceAzimuthDeg: 180,
      albedoFraction: 0.2,
    })
    expectClose(poa, 88.30222215594891, 1e-9)
  })

  // Source: REFERENCES §2.6 worked example [C] (Jun 21 10:00 UTC, 40° N: zenith 30.498°, sun azimuth 113.659°;
  // DNI 800, DHI 100, GHI 789.32, albedo 0.2, panel facing south). Tolerance 0.05 W/m².
  it.each([
    [0, 789.32],
    [30, 782.31],
    [60, 600.22],
    [90, 291.86],
  ])('tilt %d° gives %f W/m²', (tilt, total) => {
    const poa = planeOfArrayIsotropicWPerM2({
      dniWPerM2: 800,
      dhiWPerM2: 100,
      ghiWPerM2: 800 * Math.cos((30.498 * Math.PI) / 180) + 100,
      zenithDeg: 30.498,
      sunAzimuthDeg: 113.659,
      tiltDeg: tilt,
      surfaceAzimuthDeg: 180,
      albedoFraction: 0.2,
    })
    expectClose(poa, total, 0.05)
  })

  // Source: Duffie & Beckman Example 1.6.1 (answer from memory [M]; recomputed θ = 35.16° [C], REFERENCES §1.5):
  // φ 43°, δ −13.95°, ω −22.5°, β 45°, γ 15° west of south. Here expressed as sun zenith/azimuth from those angles.
  it('angle of incidence in D&B Ex. 1.6.1 is about 35°', () => {
    const DEG = Math.PI / 180
    const [phi, delta, omega] = [43 * DEG, -13.95 * DEG, -22.5 * DEG]
    const cosZ = Math.sin(phi) * Math.sin(delta) + Math.cos(phi) * Math.cos(delta) * Math.cos(omega)
    const zen = Math.acos(cosZ)
    const azFromSouth = Math.atan2(
      Math.sin(omega),
      Math.cos(omega) * Math.sin(phi) - Math.tan(delta) * Math.cos(phi),
    )
    const theta = Math.acos(cosAngleOfIncidence(zen / DEG, azFromSouth / DEG + 180, 45, 180 + 15)) / DEG
    expectClose(theta, 35.16, 0.3)
  })
})
