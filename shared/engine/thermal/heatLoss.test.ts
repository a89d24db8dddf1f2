import { describe, it, expect } from 'vitest'
import { uValueWPerM2K } from './heatLoss.ts'
import { stepPackTemperature, type ThermalParams } from './packTemperature.ts'
import { expectClose } from '../testing.ts'

// Battery-box example, REFERENCES §6.4 [C]: h_i 8, 25 mm PIR k 0.025, h_o 25 → U 0.8584 W/(m²·K);
// A 0.5 m² → UA 0.4292 W/K; 20 kg LFP at 1100 J/(kg·K) → τ = 14.24 h.
const U = uValueWPerM2K(0.025, 0.025)
const UA = U * 0.5
const box = (heaterPowerW: number, on = 4.9, off = 5.1): ThermalParams => ({
  heatCapacityJPerK: 20 * 1100,
  conductanceWPerK: UA,
  heaterPowerW,
  heaterOnBelowC: on,
  heaterOffAboveC: off,
})

/** Run hourly steps; returns the heater's energy and the end state. */
function runHours(p: ThermalParams, startC: number, ambientC: number, hours: number) {
  let t = startC
  let on = false
  let wh = 0
  const states: boolean[] = []
  for (let h = 0; h < hours; h++) {
    const r = stepPackTemperature(p, t, on, ambientC, 1)
    wh += r.heaterOnH * p.heaterPowerW
    t = r.endTempC
    on = r.heaterOnEnd
    states.push(on)
  }
  return { wh, endC: t, states }
}

describe('enclosure heat loss and heater pad', () => {
  it('U of the battery box is 0.8584 W/(m²·K) (REFERENCES §6.4, ISO 6946 layers)', () => {
    expectClose(U, 0.8584, 1e-4)
  })

  // Hand calculation (REFERENCES §6.4 [C]): holding +5 °C at −20 °C takes P = UA·ΔT = 0.4292 × 25 = 10.73 W,
  // 128.8 Wh per 12 h night. With a narrow thermostat band (4.9–5.1 °C) the heater's long-run energy must
  // match U·A·ΔT·t; tolerance 1 % (the band's ±0.1 K is 0.4 % of ΔT).
  it('steady-state heater energy equals U·A·ΔT by hand calculation', () => {
    const warm = runHours(box(40), 5, -20, 48) // settle into the band
    expect(warm.endC).toBeGreaterThan(4.8)
    const r = runHours(box(40), warm.endC, -20, 240)
    const expectedWh = UA * 25 * 240
    expectClose(r.wh, expectedWh, expectedWh * 0.01, 'heater Wh over 240 h')
    expectClose(expectedWh / 20, 128.8, 0.1, '12 h night')
  })

  it('never runs while the ambient stays above the on threshold', () => {
    const r = runHours(box(40, 3, 6), 10, 4, 200)
    expect(r.wh).toBe(0)
    expect(r.endC).toBeGreaterThan(3)
  })

  // Hysteresis (lumped capacitance, Incropera ch. 5): with the pad on from 3 °C to 6 °C and off from 6 °C
  // back to 3 °C at −10 °C ambient and 40 W, one cycle lasts
  //   heating t_on = τ ln((T∞ − 3)/(T∞ − 6)), T∞ = −10 + 40/UA;  cooling t_off = τ ln((6 + 10)/(3 + 10)).
  // Over a long run the pad's duty fraction must be t_on/(t_on + t_off), and it must switch both ways.
  it('hysteresis gives the expected switching and duty', () => {
    const tau = (20 * 1100) / UA / 3600
    const tInf = -10 + 40 / UA
    const tOn = tau * Math.log((tInf - 3) / (tInf - 6))
    const tOff = tau * Math.log(16 / 13)
    const duty = tOn / (tOn + tOff)
    const r = runHours(box(40, 3, 6), 4.5, -10, 500)
    expectClose(r.wh / (40 * 500), duty, 0.01, 'duty')
    const switches = r.states.filter((s, i) => i > 0 && s !== r.states[i - 1]).length
    expect(switches).toBeGreaterThan(10)
  })

  // Cool-down example, REFERENCES §6.4 [C]: 15 °C → 5 °C at −20 °C with no heater takes 4.79 h;
  // after 8 h the pack is at −0.04 °C. Tolerance 0.05 K.
  it('cools as a lumped mass: 15 °C to −0.04 °C in 8 h at −20 °C', () => {
    const r = runHours(box(0), 15, -20, 8)
    expectClose(r.endC, -0.04, 0.05)
  })

  // Warm-up example, REFERENCES §6.4 [C]: 40 W pad, −10 → +5 °C at −20 °C ambient takes 2.83 h.
  it('warms from −10 °C to 5 °C in 2.83 h with a 40 W pad at −20 °C', () => {
    const p = box(40, 5, 5.0001)
    const r = stepPackTemperature(p, -10, true, -20, 2.83)
    expectClose(r.endTempC, 5, 0.05)
  })
})
