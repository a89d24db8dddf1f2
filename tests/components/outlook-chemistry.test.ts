// @vitest-environment happy-dom
/**
 * Lithium against lead-acid for the pack the trip needs: the engine's comparison carried to the Pack needed
 * size equals the engine's own comparison for a pack of that size, and the table offers that size first.
 */
import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { Quasar } from 'quasar'
import winterRaw from '../../data/examples/winter-week-lofoten.json?raw'
import OutlookChemistry from '../../src/components/outlook/OutlookChemistry.vue'
import { chemistryAt, chemistryBases } from '../../src/components/outlook/chemistry'
import { scaledPack } from '../../src/components/outlook/whatIf'
import {
  analysePlan,
  compareChemistries,
  parsePlan,
  resolveBattery,
  resultsToJson,
} from '../../shared/engine/index'

function winter(cellAh = 200) {
  const input = JSON.parse(winterRaw)
  input.battery.cellCapacityAh = cellAh
  input.battery.massKg = (22 * cellAh) / 200
  const r = parsePlan(input)
  if (!r.ok) throw new Error(JSON.stringify(r.fields))
  return r.plan
}

describe('chemistry comparison at the Pack needed size', () => {
  it('equals the engine’s own comparison for a pack of that size', () => {
    const plan = winter(50) // far too small: 50 Ah
    const a = resultsToJson(analysePlan(plan))
    const need = a.packNeeded.capacityAh!
    expect(need).toBeGreaterThan(50)
    const mine = chemistryAt(a, need)
    const engine = compareChemistries(resolveBattery({ ...plan.battery, ...scaledPack(plan.battery, need) }))
    expect(mine.map((r) => r.chemistry)).toEqual(engine.map((r) => r.chemistry))
    mine.forEach((r, i) => {
      const e = engine[i]!
      for (const k of [
        'capacityAh',
        'massKg',
        'priceTotal',
        'lifetimeDeliveredKWh',
        'costPerDeliveredKWh',
      ] as const)
        expect(r[k], `${r.chemistry} ${k}`).toBeCloseTo(e[k], 2)
      expect(r.cycleLifeCycles).toBe(e.cycleLifeCycles)
    })
    // Lead-acid goes half as deep as LFP's 90 %: 1.8 × the ampere-hours for the same usable energy.
    expect(mine.find((r) => r.chemistry === 'agm')!.capacityAh / need).toBeCloseTo(0.9 / 0.5, 6)
  })

  it('counts what the trip asks of the pack for the years: a pack too small to serve it is not worn less', () => {
    const a = resultsToJson(analysePlan(winter(50)))
    const need = a.packNeeded.capacityAh!
    const lfp = (ah: number) => chemistryAt(a, ah).find((r) => r.chemistry === 'lfp')!
    // At the needed size the daily throughput includes the loads the small pack had to shed.
    const perDay = (a.totals.dischargeOutWh + a.summary.shortageWh) / a.days.length
    const usable = need * 12.8 * 0.9
    expect(lfp(need).years).toBeCloseTo(3000 / ((perDay / usable) * 365), 6)
  })

  it('offers Pack needed, with margin and yours, and starts with Pack needed', () => {
    const a = resultsToJson(analysePlan(winter(50)))
    expect(chemistryBases(a).map((b) => b.key)).toEqual(['needed', 'margin', 'yours'])
    const w = mount(OutlookChemistry, {
      props: { analysis: a, prefs: { unitSystem: 'metric', temperatureUnit: 'C' }, currency: 'EUR' },
      global: { plugins: [[Quasar, {}]] },
    })
    const capacity = w
      .get('[data-test="chem-row-capacity"]')
      .findAll('td')
      .map((td) => td.text())
    expect(capacity[0]).toBe(`${a.packNeeded.capacityAh} Ah`)
    expect(w.get('[data-test="chemistry-basis-needed"]').attributes('aria-pressed')).toBe('true')
    expect(w.text()).toContain(
      `The same usable energy as ${a.packNeeded.capacityAh} Ah of Lithium iron phosphate`,
    )
  })
})
