/**
 * Sun position for one instant, from suncalc 2.0.2 (Meeus-based; its README states typical errors of
 * about 0.08° in position). suncalc 2.x returns degrees, the altitude refraction-corrected (apparent),
 * and the azimuth from north, clockwise — checked in position.test.ts.
 */
import * as SunCalc from 'suncalc'

export interface SunPosition {
  /** Apparent (refraction-corrected) elevation above the horizon. [°] */
  elevationDeg: number
  /** From north, clockwise: 90 east, 180 south, 270 west. [°] */
  azimuthDeg: number
}

/**
 * @param epochMs - the instant, milliseconds since 1970-01-01T00:00Z. [ms]
 * @param latitudeDeg - north positive. [°]
 * @param longitudeDeg - east positive. [°]
 */
export function sunPosition(epochMs: number, latitudeDeg: number, longitudeDeg: number): SunPosition {
  const p = SunCalc.getPosition(new Date(epochMs), latitudeDeg, longitudeDeg)
  const az = p.azimuth % 360
  return { elevationDeg: p.altitude, azimuthDeg: az < 0 ? az + 360 : az }
}
