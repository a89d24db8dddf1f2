/**
 * Plane-of-array irradiance with the isotropic sky model (Liu & Jordan; Hottel & Woertz):
 *   POA = DNI cos θ + DHI (1 + cos β)/2 + GHI ρ (1 − cos β)/2,
 *   cos θ = cos z cos β + sin z sin β cos(γ_sun − γ_surface).
 * @see B. Y. H. Liu, R. C. Jordan, "The long-term average performance of flat-plate solar-energy collectors",
 *      Solar Energy 7(2):53–74, 1963; Duffie & Beckman 4th ed. §2.15 (eq. 2.15.1).
 */

const DEG = Math.PI / 180

export interface PlaneOfArrayInput {
  dniWPerM2: number
  dhiWPerM2: number
  ghiWPerM2: number
  /** Sun zenith. [°] */
  zenithDeg: number
  /** Sun azimuth, from north clockwise. [°] */
  sunAzimuthDeg: number
  /** Panel tilt from horizontal. [°] */
  tiltDeg: number
  /** Panel azimuth, from north clockwise. [°] */
  surfaceAzimuthDeg: number
  albedoFraction: number
}

/** Cosine of the angle of incidence on the panel; negative when the sun is behind it. */
export function cosAngleOfIncidence(
  zenithDeg: number,
  sunAzimuthDeg: number,
  tiltDeg: number,
  surfaceAzimuthDeg: number,
): number {
  const z = zenithDeg * DEG
  const b = tiltDeg * DEG
  return (
    Math.cos(z) * Math.cos(b) +
    Math.sin(z) * Math.sin(b) * Math.cos((sunAzimuthDeg - surfaceAzimuthDeg) * DEG)
  )
}

/** @returns total plane-of-array irradiance [W/m²] */
export function planeOfArrayIsotropicWPerM2(i: PlaneOfArrayInput): number {
  const cosB = Math.cos(i.tiltDeg * DEG)
  const cosAoi = cosAngleOfIncidence(i.zenithDeg, i.sunAzimuthDeg, i.tiltDeg, i.surfaceAzimuthDeg)
  const beam = i.dniWPerM2 * Math.max(0, cosAoi)
  const sky = (i.dhiWPerM2 * (1 + cosB)) / 2
  const ground = (i.ghiWPerM2 * i.albedoFraction * (1 - cosB)) / 2
  return beam + sky + ground
}
