// @vitest-environment happy-dom
import { describe, expect, it, beforeEach, vi } from 'vitest'
import { mount, RouterLinkStub } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import winterRaw from '../../data/examples/winter-week-lofoten.json?raw'
import summerRaw from '../../data/examples/summer-month-andalusia.json?raw'
import OutlookVerdict from '../../src/components/outlook/OutlookVerdict.vue'
import OutlookFigures from '../../src/components/outlook/OutlookFigures.vue'
import OutlookTryChange from '../../src/components/outlook/OutlookTryChange.vue'
import { verdictView, type VerdictInput } from '../../src/components/outlook/verdict'
import { applyWhatIf, whatIfBase } from '../../src/components/outlook/whatIf'
import { compareRows } from '../../src/components/outlook/compare'
import { analysePlan, parsePlan, resultsToJson, simulate, type Plan } from '../../shared/engine/index'

const EXAMPLES: Record<string, string> = {
  'winter-week-lofoten': winterRaw,
  'summer-month-andalusia': summerRaw,
}

function example(name: string): Plan {
  const r = parsePlan(JSON.parse(EXAMPLES[name]!))
  if (!r.ok) throw new Error(JSON.stringify(r.fields))
  return r.plan
}

/** A hand-made result: 200 Ah at 12.8 V, floor 10 %. */
function made(
  over: Partial<{
    status: 'carries' | 'tight' | 'short'
    lowest: number
    lowestHour: number
    first: number
    unserved: number
  }>,
): VerdictInput {
  const lowest = over.lowest ?? 0.33
  const status = over.status ?? 'carries'
  return {
    verdict: { status, marginFraction: lowest - 0.1, marginWh: (lowest - 0.1) * 2560, message: '' },
    summary: {
      lowestSocFraction: lowest,
      lowestSocHour: over.lowestHour ?? 77,
      finalSocFraction: 0.8,
      startSocFraction: 0.9,
      unservedWh: over.unserved ?? 0,
      shortageWh: over.unserved ?? 0,
    },
    totals: { firstShortageHour: over.first ?? -1 },
    plan: { battery: { socFloorFraction: 0.1 } },
  }
}

let pinia: Pinia
beforeEach(() => {
  pinia = createPinia()
  setActivePinia(pinia)
})

describe('the verdict', () => {
  it('answers first, in words, with the margin: carries', () => {
    const v = verdictView(made({ lowest: 0.33, lowestHour: 77 }))
    expect(v.headline).toBe('Carries the trip with 23 % to spare')
    // Hour 77 is 05:00–06:00 of day 4; times are the end of the hour.
    expect(v.detail).toBe('Lowest charge 33 % on day 4 at 06:00; the floor you set is 10 %.')
    expect(v.margin).toBe('23 % of the pack (589 Wh) stays above the floor at the lowest point.')
    expect(v.tone).toBe('positive')
  })

  it('says when a carried trip is tight, and when and how a short one runs out', () => {
    const tight = verdictView(made({ status: 'tight', lowest: 0.16 }))
    expect(tight.headline).toBe('Carries the trip, but only 6 % to spare')
    expect(tight.margin).toContain('A plain “carries” keeps at least 10 % in reserve')
    // The bare Pack needed leaves nothing above the floor: said in words, not as "0 %".
    expect(verdictView(made({ status: 'tight', lowest: 0.1002 })).headline).toBe(
      'Carries the trip, with nothing to spare',
    )
    // The trip's last hour is its end, at 24:00 of the last day.
    expect(verdictView({ ...made({ lowest: 0.5, lowestHour: 167 }), hours: 168 }).detail).toBe(
      'Lowest charge 50 % on day 7 at 24:00, the end of the trip; the floor you set is 10 %.',
    )
    const short = verdictView(made({ status: 'short', lowest: 0.1, first: 77, unserved: 1234 }))
    // The first hour shed and the lowest charge are the same hour, and read as the same time.
    expect(short.headline).toBe('Runs short on day 4 at 06:00')
    expect(short.detail).toBe('Lowest charge 10 %, the floor you set, on day 4 at 06:00.')
    expect(short.margin).toBe('1.2 kWh of loads would go unserved over the trip.')
    expect(short.tone).toBe('negative')
    // Shed only through the inverter rating: there is no first hour at the floor.
    expect(verdictView(made({ status: 'short', first: -1, unserved: 50 })).headline).toBe(
      'Cannot serve every load on this trip',
    )
  })

  it('renders with an icon and words, not colour alone, and marks an unsaved change', () => {
    const w = mount(OutlookVerdict, {
      props: { result: made({ status: 'short', lowest: 0.1, first: 50, unserved: 400 }), trying: true },
      global: { plugins: [[Quasar, {}], pinia] },
    })
    expect(w.get('[data-test="verdict"]').attributes('data-status')).toBe('short')
    expect(w.get('h2').text()).toBe('Runs short on day 3 at 03:00')
    expect(w.text()).toContain('with your change, not saved')
    expect(w.find('.q-icon').text()).toBe('battery_alert')
  })

  it('is repeated in "Try a change" when asked (the Verdict off screen), with the same words and icon', () => {
    const base = whatIfBase(example('winter-week-lofoten'))
    const props = {
      base,
      whatIf: {},
      prefs: { unitSystem: 'metric', temperatureUnit: 'C' } as const,
      changed: true,
      canSave: true,
    }
    const global = { plugins: [[Quasar, {}], pinia] as never }
    expect(mount(OutlookTryChange, { props, global }).find('[data-test="try-answer"]').exists()).toBe(false)
    const view = verdictView(made({ status: 'tight', lowest: 0.14 }))
    const w = mount(OutlookTryChange, { props: { ...props, answer: view }, global })
    const answer = w.get('[data-test="try-answer"]')
    expect(answer.attributes('data-status')).toBe('tight')
    // Not a live region itself (its caption changes on every step); the hidden region below speaks.
    expect(answer.attributes('role')).toBeUndefined()
    expect(answer.get('[data-test="try-answer-headline"]').text()).toBe(
      'Carries the trip, but only 4 % to spare',
    )
    expect(answer.text()).toContain('Lowest charge 14 % on day 4 at 06:00')
    expect(answer.text()).not.toContain('floor')
    expect(answer.find('.q-icon').text()).toBe('warning')
  })

  it('announces the headline to screen readers once the controls are still, not on opening nor per step', async () => {
    vi.useFakeTimers()
    try {
      const props = {
        base: whatIfBase(example('winter-week-lofoten')),
        whatIf: {},
        prefs: { unitSystem: 'metric', temperatureUnit: 'C' } as const,
        changed: false,
        canSave: true,
        headline: 'Runs short on day 3 at 03:00',
      }
      const w = mount(OutlookTryChange, { props, global: { plugins: [[Quasar, {}], pinia] as never } })
      const region = w.get('[data-test="try-announce"]')
      expect(region.attributes('aria-live')).toBe('polite')
      await vi.advanceTimersByTimeAsync(2000)
      expect(region.text()).toBe('')
      await w.setProps({ changed: true, headline: 'Runs short on day 4 at 06:00' })
      await vi.advanceTimersByTimeAsync(300)
      await w.setProps({ headline: 'Carries the trip, but only 4 % to spare' })
      await vi.advanceTimersByTimeAsync(300)
      expect(region.text()).toBe('')
      await vi.advanceTimersByTimeAsync(600)
      expect(region.text()).toBe('Carries the trip, but only 4 % to spare')
    } finally {
      vi.useRealTimers()
    }
  })

  it('flips from short to carries on the real engine when the winter van gets a bigger pack', () => {
    const plan = example('winter-week-lofoten')
    const base = resultsToJson(simulate(plan))
    expect(base.verdict.status).toBe('short')
    expect(verdictView(base).headline).toMatch(/^Runs short on day \d at \d\d:00$/)
    const bigger = resultsToJson(simulate(applyWhatIf(plan, { capacityAh: 300 })))
    expect(bigger.plan.battery.capacityAh).toBe(300)
    expect(bigger.verdict.status).not.toBe('short')
    expect(verdictView(bigger).headline).toMatch(/^Carries the trip/)
    // The stored plan is untouched by a what-if.
    expect(whatIfBase(plan).capacityAh).toBe(200)
  })
})

describe('the key figures', () => {
  it('shows every figure with its unit, in °F for an imperial user, with the cold-charging caution', () => {
    const plan = example('winter-week-lofoten')
    const analysis = resultsToJson(analysePlan(plan))
    const w = mount(OutlookFigures, {
      props: {
        result: analysis,
        analysis,
        stale: false,
        progress: null,
        analysisError: null,
        prefs: { unitSystem: 'imperial', temperatureUnit: 'F' },
        vehicleId: 'v1',
        canWrite: true,
      },
      global: { plugins: [[Quasar, {}], pinia], stubs: { RouterLink: RouterLinkStub } },
    })
    expect(w.get('[data-test="figure-autonomy"]').text()).toMatch(/\d(\.\d)? days?/)
    expect(w.get('[data-test="figure-pack-needed"]').text()).toMatch(
      new RegExp(`${analysis.packNeeded.capacityAh} Ah`),
    )
    expect(w.get('[data-test="figure-pack-needed"]').text()).toContain('Yours: 200 Ah at 12.8 V')
    expect(w.get('[data-test="figure-solar-needed"]').text()).toContain('Yours: 400 Wp')
    expect(w.get('[data-test="figure-classic"]').text()).toMatch(/\d+ Ah\s*classic sizing/)
    expect(w.get('[data-test="classic-sentence"]').text().length).toBeGreaterThan(40)
    const cold = w.get('[data-test="figure-cold"]').text()
    expect(cold).toMatch(/\d+ Wh/)
    expect(cold).toContain('32 °F') // LFP charge minimum 0 °C shown in °F
    expect(cold).not.toContain('°C')
    expect(w.get('[data-test="cold-caution"]').text()).toContain('must not be charged below freezing (32 °F)')
  })

  it('marks the better value in Side by side, and leaves unranked rows unmarked', () => {
    const winter = resultsToJson(analysePlan(example('winter-week-lofoten')))
    const summer = resultsToJson(analysePlan(example('summer-month-andalusia')))
    const rows = compareRows([winter, summer])
    const lowest = rows.find((r) => r.key === 'lowest')!
    expect(lowest.best).toEqual([winter.summary.lowestSocFraction > summer.summary.lowestSocFraction ? 0 : 1])
    expect(lowest.texts.every((t) => / %$/.test(t))).toBe(true)
    const heater = rows.find((r) => r.key === 'heater')!
    // Unranked: the winter pad's energy is not worse than the summer's none (a pack that runs short sheds it).
    expect(heater.texts[1]).toBe('0 Wh')
    expect(heater.best).toEqual([])
    expect(rows.find((r) => r.key === 'days')!.best).toEqual([])
    expect(rows.find((r) => r.key === 'verdict')!.texts[0]).toMatch(/^Runs short/)
  })

  it('explains energy in against energy used: in − used − lost in the pack = change in the pack', () => {
    const winter = resultsToJson(analysePlan(example('winter-week-lofoten')))
    const summer = resultsToJson(analysePlan(example('summer-month-andalusia')))
    const rows = compareRows([winter, summer])
    const v = (key: string) => rows.find((r) => r.key === key)!.values
    for (const i of [0, 1])
      expect(Math.abs(v('in')[i]! - v('out')[i]! - v('loss')[i]! - v('change')[i]!)).toBeLessThan(0.05)
    // The winter week ends lower than it started, the summer month higher: signs shown.
    expect(rows.find((r) => r.key === 'change')!.texts[0]).toMatch(/^−[\d,.]+ k?Wh$/)
    expect(rows.find((r) => r.key === 'change')!.texts[1]).toMatch(/^\+[\d,.]+ k?Wh$/)
  })
})
