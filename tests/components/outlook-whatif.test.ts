// @vitest-environment happy-dom
/**
 * "Try a change" scales a tried pack exactly as the engine's pack search scales capacity
 * (shared/engine/battery/run.ts), so the sizing answers do not move when only the tried capacity moves.
 */
import { describe, expect, it } from 'vitest'
import winterRaw from '../../data/examples/winter-week-lofoten.json?raw'
import cabinRaw from '../../data/examples/cabin-autumn-overcast.json?raw'
import { applyWhatIf, scaledPack } from '../../src/components/outlook/whatIf'
import { analysePlan, parsePlan, resolveBattery, type Plan } from '../../shared/engine/index'

function plan(raw: string): Plan {
  const r = parsePlan(JSON.parse(raw))
  if (!r.ok) throw new Error(JSON.stringify(r.fields))
  return r.plan
}

describe('a tried pack capacity', () => {
  it('scales mass and current limits with capacity, the box area with capacity^(2/3), and keeps the heater pad', () => {
    const winter = plan(winterRaw) // stores its mass (22 kg), box (0.5 m²) and pad (40 W); limits by default
    const stored = resolveBattery(winter.battery)
    const tried = resolveBattery(applyWhatIf(winter, { capacityAh: 400 }).battery)
    expect(tried.capacityAh).toBe(400)
    expect(tried.massKg).toBeCloseTo(44, 9)
    expect(tried.maxChargeCurrentA).toBeCloseTo(stored.maxChargeCurrentA * 2, 9)
    expect(tried.maxDischargeCurrentA).toBeCloseTo(stored.maxDischargeCurrentA * 2, 9)
    // Twice the volume in a box of the same shape: 2^(2/3) = 1.5874 times the area.
    expect(tried.enclosure.areaM2).toBeCloseTo(0.5 * 1.587401, 6)
    expect(tried.enclosure.thicknessM).toBe(stored.enclosure.thicknessM)
    expect(tried.heater).toEqual({ powerW: 40, onBelowC: 3, offAboveC: 6 })
    // The stored plan is not touched.
    expect(winter.battery.cellCapacityAh).toBe(200)
    expect(winter.battery.enclosure?.areaM2).toBe(0.5)
  })

  it('pins a default that would follow capacity on its own (the preset heater pad) at the stored pack’s value', () => {
    const cabin = plan(cabinRaw) // no mass, box or pad stored: all from the LFP preset
    const stored = resolveBattery(cabin.battery)
    expect(stored.heater).not.toBeNull()
    const tried = scaledPack(cabin.battery, 300)
    expect(tried.heater).toEqual(stored.heater)
    expect(resolveBattery(applyWhatIf(cabin, { capacityAh: 300 }).battery).heater).toEqual(stored.heater)
  })

  it('leaves Pack needed and Pack needed with margin where they were, whatever capacity is tried', () => {
    for (const [name, raw, tries] of [
      ['winter van', winterRaw, [150, 305, 520]],
      ['cabin', cabinRaw, [60, 250]],
    ] as const) {
      const p = plan(raw)
      const stored = analysePlan(p).packNeeded
      expect(stored.capacityAh, name).not.toBeNull()
      for (const ah of tries) {
        const tried = analysePlan(applyWhatIf(p, { capacityAh: ah }))
        expect(tried.plan.battery.capacityAh).toBe(ah)
        expect(tried.packNeeded.capacityAh, `${name} at ${ah} Ah`).toBe(stored.capacityAh)
        expect(tried.packNeeded.withMarginCapacityAh, `${name} at ${ah} Ah`).toBe(stored.withMarginCapacityAh)
      }
    }
  })
})
