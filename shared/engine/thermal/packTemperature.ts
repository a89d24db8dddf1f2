/**
 * Pack temperature as one lumped thermal mass m·c losing heat U·A·(T − T_a), with a thermostat-switched
 * heater pad. Energy balance; exact exponential solution over each interval of constant heater state
 * (lumped capacitance, Incropera et al., Fundamentals of Heat and Mass Transfer, ch. 5, eqs. 5.5–5.7).
 *
 *   T(t) = T_∞ + (T_0 − T_∞)·exp(−t/τ),  τ = m c / (U A),  T_∞ = T_a + P_heater / (U A)
 */

export interface ThermalParams {
  /** m·c [J/K] */
  heatCapacityJPerK: number
  /** U·A [W/K] */
  conductanceWPerK: number
  heaterPowerW: number
  heaterOnBelowC: number
  heaterOffAboveC: number
}

export interface ThermalStepResult {
  endTempC: number
  /** Heater state at the end of the step (the thermostat's memory). */
  heaterOnEnd: boolean
  /** Time the heater ran during the step. [h] */
  heaterOnH: number
}

/** Most switch events solved exactly within one step; after that the step finishes in the current state. */
const MAX_SWITCHES_PER_STEP = 32

/**
 * Advance the pack temperature over one step with ambient held constant.
 * The thermostat switches on when the pack falls to onBelowC and off when it rises to offAboveC
 * (hysteresis); switch times within the step are solved exactly.
 * @param startTempC - pack temperature at the start [°C]
 * @param heaterOnStart - thermostat state carried from the previous step
 * @param ambientC - air around the enclosure [°C]
 * @param stepH - step length [h]
 */
export function stepPackTemperature(
  p: ThermalParams,
  startTempC: number,
  heaterOnStart: boolean,
  ambientC: number,
  stepH: number,
): ThermalStepResult {
  return stepPackTemperatureInto(
    { endTempC: 0, heaterOnEnd: false, heaterOnH: 0 },
    p,
    startTempC,
    heaterOnStart,
    ambientC,
    stepH,
  )
}

/** As stepPackTemperature, writing into `out` (no allocation in the hourly loop). */
export function stepPackTemperatureInto(
  out: ThermalStepResult,
  p: ThermalParams,
  startTempC: number,
  heaterOnStart: boolean,
  ambientC: number,
  stepH: number,
): ThermalStepResult {
  const tauS = p.heatCapacityJPerK / p.conductanceWPerK
  let t = startTempC
  let on = heaterOnStart
  if (p.heaterPowerW <= 0) on = false
  else if (t < p.heaterOnBelowC) on = true
  else if (t > p.heaterOffAboveC) on = false
  let remainingS = stepH * 3600
  let onS = 0
  for (let i = 0; i < MAX_SWITCHES_PER_STEP && remainingS > 0; i++) {
    const tInf = ambientC + (on ? p.heaterPowerW / p.conductanceWPerK : 0)
    const target = on ? p.heaterOffAboveC : p.heaterOnBelowC
    // Time to reach the switching temperature, if it lies between t and tInf.
    let switchS = Infinity
    if (p.heaterPowerW > 0 && ((on && target > t && target < tInf) || (!on && target < t && target > tInf))) {
      switchS = tauS * Math.log((tInf - t) / (tInf - target))
    }
    const dt = Math.min(remainingS, switchS)
    t = tInf + (t - tInf) * Math.exp(-dt / tauS)
    if (on) onS += dt
    remainingS -= dt
    if (dt === switchS) {
      t = target
      on = !on
    }
  }
  out.endTempC = t
  out.heaterOnEnd = on
  out.heaterOnH = onS / 3600
  return out
}
