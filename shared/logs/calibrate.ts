/**
 * A calibrated scenario usage: every enabled appliance's daily energy scaled by one ratio (measured ÷
 * planned use). Hours per day are scaled first; when they would not fit the appliance's window, the window
 * is filled and the duty cycle takes the rest (up to 1). Standby draw, the inverter, the BMS and the heater
 * are left as they are.
 */
import { windowLengthH, type ApplianceUsage } from '../schemas/plan.ts'

export interface CalibratableAppliance {
  id: string
  hoursPerDay: number
  startHour: number
  endHour: number
  dutyCycleFraction?: number | undefined
}

export interface CalibratedUsage {
  usage: Record<string, ApplianceUsage>
  /** Appliances that could not be scaled fully (window full and duty cycle at 1). */
  capped: string[]
}

const round = (x: number, digits: number) => Math.round(x * 10 ** digits) / 10 ** digits

export function calibrateUsage(
  appliances: readonly CalibratableAppliance[],
  usage: Readonly<Record<string, ApplianceUsage>>,
  ratio: number,
): CalibratedUsage {
  if (!(ratio > 0) || !Number.isFinite(ratio)) throw new RangeError('ratio must be a positive number')
  const out: Record<string, ApplianceUsage> = { ...usage }
  const capped: string[] = []
  for (const a of appliances) {
    const u = usage[a.id] ?? {}
    if (u.enabled === false) continue
    const hours = u.hoursPerDay ?? a.hoursPerDay
    const duty = u.dutyCycleFraction ?? a.dutyCycleFraction ?? 1
    const windowH = windowLengthH(u.startHour ?? a.startHour, u.endHour ?? a.endHour)
    const wantedH = hours * ratio
    if (wantedH <= windowH) {
      out[a.id] = { ...u, hoursPerDay: round(wantedH, 3) }
      continue
    }
    const wantedDuty = hours > 0 ? (duty * wantedH) / windowH : duty
    if (wantedDuty > 1) capped.push(a.id)
    out[a.id] = { ...u, hoursPerDay: windowH, dutyCycleFraction: round(Math.min(1, wantedDuty), 4) }
  }
  return { usage: out, capped }
}
