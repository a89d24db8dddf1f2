// @vitest-environment happy-dom
/**
 * The figures under the verdict answer the buyer's questions and lead back to the equipment: Pack needed
 * (bare and with the verdict's margin), Solar needed, each with a "Try" and a link to the vehicle's section;
 * the energy over the trip adds up (in − used − pack losses = change in the pack).
 */
import { describe, expect, it } from 'vitest'
import { mount, RouterLinkStub } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { createPinia } from 'pinia'
import winterRaw from '../../data/examples/winter-week-lofoten.json?raw'
import OutlookFigures from '../../src/components/outlook/OutlookFigures.vue'
import { dayLoads, energyBalance } from '../../src/components/outlook/energy'
import { analysePlan, parsePlan, resultsToJson, type Plan } from '../../shared/engine/index'

function winter(
  change: (p: Record<string, unknown> & { battery: Record<string, unknown> }) => void = () => {},
): Plan {
  const input = JSON.parse(winterRaw)
  change(input)
  const r = parsePlan(input)
  if (!r.ok) throw new Error(JSON.stringify(r.fields))
  return r.plan
}

function mountFigures(plan: Plan, canWrite = true) {
  const analysis = resultsToJson(analysePlan(plan))
  const w = mount(OutlookFigures, {
    props: {
      result: analysis,
      analysis,
      stale: false,
      progress: null,
      analysisError: null,
      prefs: { unitSystem: 'metric', temperatureUnit: 'C' },
      vehicleId: 'veh-1',
      canWrite,
    },
    global: { plugins: [[Quasar, {}], createPinia()], stubs: { RouterLink: RouterLinkStub } },
  })
  return { w, analysis }
}

/** What a reader sees: the element's text without icon ligatures (aria-hidden), spaces collapsed. */
const words = (el: { element: Element }): string => {
  const copy = el.element.cloneNode(true) as Element
  copy.querySelectorAll('[aria-hidden="true"]').forEach((e) => e.remove())
  return (copy.textContent ?? '').replace(/\s+/g, ' ').trim()
}

const linkTo = (w: ReturnType<typeof mountFigures>['w'], test: string) =>
  w.get(`[data-test="${test}"]`).findComponent(RouterLinkStub).props('to')

describe('Pack needed and Solar needed', () => {
  it('give the bare pack and the pack with 10 % to spare, each to try, and link back to the battery bank', async () => {
    const { w, analysis } = mountFigures(winter())
    const pack = w.get('[data-test="figure-pack-needed"]')
    const need = analysis.packNeeded
    expect(pack.get('.ow-figure__value').text()).toBe(`${need.capacityAh} Ah`)
    const margin = pack.get('[data-test="pack-with-margin"]')
    expect(margin.get('.ow-figure__value').text()).toBe(`${need.withMarginCapacityAh} Ah`)
    expect(margin.get('.ow-figure__sub').text()).toBe('with 10 % to spare')
    expect(pack.text()).toContain(
      'at its lowest the charge just touches the floor (10 %): “with nothing to spare”',
    )
    expect(pack.text()).toContain(
      `${need.withMarginCapacityAh} Ah keeps 10 % of the pack above the floor, for a plain “Carries the trip”`,
    )
    expect(words(w.get('[data-test="change-battery"]'))).toBe('Change the battery bank')
    expect(linkTo(w, 'change-battery')).toEqual({
      name: 'vehicles.detail',
      params: { vehicleId: 'veh-1' },
      query: { section: 'battery' },
    })
    await w.get('[data-test="try-pack-margin"]').trigger('click')
    expect(w.emitted('try')).toEqual([[{ capacityAh: need.withMarginCapacityAh }]])
  })

  it('gives the winter van a Wp figure (the old rule said “not reachable”) and links to its charging', async () => {
    const { w, analysis } = mountFigures(winter())
    const solar = w.get('[data-test="figure-solar-needed"]')
    expect(analysis.solarNeeded.peakPowerWp).toBeGreaterThan(400)
    expect(solar.get('.ow-figure__value').text()).toMatch(/^[\d,]+ Wp$/)
    expect(solar.text()).toContain('back to full on the last day')
    expect(linkTo(w, 'change-solar')).toEqual({
      name: 'vehicles.detail',
      params: { vehicleId: 'veh-1' },
      query: { section: 'charging' },
    })
    await w.get('[data-test="try-solar-needed"]').trigger('click')
    expect(w.emitted('try')).toEqual([[{ arrayWp: analysis.solarNeeded.peakPowerWp }]])
  })

  it('for a pack too small for one night, gives the array for the Pack needed size and tries both', async () => {
    const { w, analysis } = mountFigures(winter((p) => (p.battery.cellCapacityAh = 20)))
    const need = analysis.packNeeded.capacityAh!
    expect(analysis.solarNeeded.capacityAh).toBe(need)
    const solar = w.get('[data-test="figure-solar-needed"]')
    expect(solar.get('[data-test="solar-for-pack"]').text()).toBe(`with a ${need} Ah pack (Pack needed)`)
    expect(solar.text()).toContain('Your own pack cannot get there: even with 100,000 Wp the 20 Ah pack')
    await w.get('[data-test="try-solar-needed"]').trigger('click')
    expect(w.emitted('try')).toEqual([[{ arrayWp: analysis.solarNeeded.peakPowerWp, capacityAh: need }]])
  })

  it('holds their Try buttons while the sizing figures belong to an older version of the change', async () => {
    const { w } = mountFigures(winter())
    await w.setProps({ stale: true })
    const buttons = ['try-pack-needed', 'try-pack-margin', 'try-solar-needed'].map((t) =>
      w.get(`[data-test="${t}"]`),
    )
    for (const b of buttons) {
      expect(b.attributes('disabled')).toBeDefined()
      await b.trigger('click')
    }
    expect(w.emitted('try')).toBeUndefined()
    await w.setProps({ stale: false })
    for (const b of buttons) expect(b.attributes('disabled')).toBeUndefined()
  })

  it('says “See” instead of “Change” to someone who may only read the vehicle', () => {
    const { w } = mountFigures(winter(), false)
    expect(words(w.get('[data-test="change-battery"]'))).toBe('See the battery bank')
    expect(words(w.get('[data-test="change-solar"]'))).toBe('See the charging')
  })
})

describe('energy over the trip', () => {
  it('adds up: in − used − pack losses = change in the pack, and shows each term', () => {
    const { w, analysis } = mountFigures(winter())
    const e = energyBalance(analysis)
    // Energy balance of the hourly run, to the results' rounding (1 mWh per figure).
    expect(Math.abs(e.inWh - e.usedWh - e.packLossWh - e.changeWh)).toBeLessThan(0.05)
    expect(e.changeWh).toBeCloseTo(
      (analysis.summary.finalSocFraction - analysis.summary.startSocFraction) * analysis.totals.capacityWh,
      0,
    )
    expect(e.inverterWh).toBeGreaterThan(0) // the winter van's inverter: its idle draw and conversion
    // Label and figure of each row, as "label | figure".
    const rows = w
      .findAll('[data-test="energy-balance"] tr')
      .map((r) => `${words(r.get('th'))} | ${words(r.get('td'))}`)
    expect(rows).toHaveLength(4)
    expect(rows[0]).toMatch(/^In from the charge sources \| [\d,]+ Wh$/)
    expect(rows[1]).toMatch(
      /^− Used of it heater pad [\d,]+ Wh, inverter's own draw [\d,]+ Wh, BMS [\d,]+ Wh \| [\d,]+ Wh$/,
    )
    expect(rows[2]).toContain('charging and discharging at 95 % round trip')
    expect(rows[3]).toMatch(/^= Change in the pack 90 % at the start, \d+ % at the end \| [−+][\d,]+ Wh$/)
    // The shown terms add up to the shown change, to a watt-hour of rounding.
    const wh = (t: string) => Number(/([−+]?[\d,]+) Wh$/.exec(t)![1]!.replace(/,/g, '').replace('−', '-'))
    expect(Math.abs(wh(rows[0]!) - wh(rows[1]!) - wh(rows[2]!) - wh(rows[3]!))).toBeLessThanOrEqual(1)
  })
})

describe('day by day loads', () => {
  it('shows what was asked for beside what was served: a day that runs short asks for more than it gets', () => {
    const { analysis } = mountFigures(winter())
    const short = analysis.days.find((d) => d.unservedWh > 100)!
    const l = dayLoads(short)
    const served = Object.values(short.outWh).reduce((a, b) => a + b, 0)
    expect(l.servedWh).toBeCloseTo(served, 6)
    expect(l.askedWh).toBeCloseTo(served + short.unservedWh, 6)
    expect(l.askedWh).toBeGreaterThan(l.servedWh + 100)
    // A day that is carried asks for about what a short one does: the demand, not what happened to be served.
    const carried = analysis.days.find((d) => d.unservedWh < 0.5)!
    expect(Math.abs(dayLoads(carried).askedWh - l.askedWh)).toBeLessThan(0.5 * l.askedWh)
  })
})
