import { describe, expect, it } from 'vitest'
import { CHEMISTRIES } from '../schemas/plan.ts'
import { resolveBattery } from '../engine/presets.ts'
import { protectionRules, resolveThresholds } from './protection.ts'
import { computeBuildSheet } from './sheet.ts'
import { testVan } from './testPlans.ts'

const rulesFor = (chem: (typeof CHEMISTRIES)[number]) =>
  protectionRules(resolveBattery(testVan(chem).battery))

describe('protection rules per chemistry preset', () => {
  it.each(CHEMISTRIES)('%s: every path has its conditions, thresholds are consistent and sourced', (chem) => {
    const p = rulesFor(chem)
    const actions = p.rules.map((r) => r.action)
    // charge path: too cold, too hot, too full; load path: too cold, too hot, too empty
    expect(actions.filter((a) => a === 'charge-path-opens')).toHaveLength(3)
    expect(actions.filter((a) => a === 'load-path-opens')).toHaveLength(3)
    expect(actions.filter((a) => a === 'inverter-off').length).toBeGreaterThanOrEqual(2)
    expect(p.issues).toEqual({})
    for (const [key, t] of Object.entries(p.thresholds)) {
      if (key.startsWith('heater') && chem !== 'lfp') continue
      expect(t.source, key).not.toBe('')
      expect(Number.isFinite(t.value), key).toBe(true)
    }
  })

  it('LFP: no charging below 0 °C (Petzl & Danzer 2014 via the engine preset) and 3.65 V cell limit [M]', () => {
    const p = rulesFor('lfp')
    expect(p.thresholds.chargeMinC.value).toBe(0)
    expect(p.thresholds.chargeMinC.source).toMatch(/plan/)
    expect(p.thresholds.cellChargeCutoffV.value).toBe(3.65)
    const tooCold = p.rules.find((r) => r.id === 'charge-too-cold')!
    expect(tooCold.condition).toBe('Any cell colder than 0 °C')
    const tooFull = p.rules.find((r) => r.id === 'charge-too-full')!
    expect(tooFull.condition).toContain('3.65 V per cell (14.6 V pack)') // 4 × 3.65 = 14.6 V (REFERENCES §5.1)
    // Charger: absorption 3.55 V/cell → 14.2 V (REFERENCES §5.1 [CP]); no temperature compensation; no equalising.
    const s = Object.fromEntries(p.chargerSettings.map((c) => [c.id, c.value]))
    expect(s['charger-absorption']).toContain('14.2 V pack')
    expect(s['charger-temp-comp']).toBe('off')
    expect(s['charger-no-equalise']).toMatch(/off/)
    expect(p.rules.some((r) => r.action === 'heater-on')).toBe(true)
  })

  it('AGM: charges below 0 °C (−20 °C preset), temperature compensation −4 mV/K per cell, float 13.6 V', () => {
    const p = rulesFor('agm')
    expect(p.thresholds.chargeMinC.value).toBe(-20)
    const s = Object.fromEntries(p.chargerSettings.map((c) => [c.id, c.value]))
    expect(s['charger-temp-comp']).toContain('−24 mV/K pack') // 6 cells × −4 mV/K
    expect(s['charger-float']).toContain('13.6 V pack') // 6 × 2.267 = 13.60 V
    expect(s['charger-absorption']).toContain('14.7 V pack') // 2.45 V/cell, AGM 14.4–14.7 V (REFERENCES §5.1 [CP])
    expect(p.rules.some((r) => r.action === 'heater-on')).toBe(false) // no pad in the plan
  })

  it('gel and flooded: float 13.8 V and 13.2 V per 12 V block', () => {
    const gel = Object.fromEntries(rulesFor('gel').chargerSettings.map((c) => [c.id, c.value]))
    const flooded = Object.fromEntries(rulesFor('flooded').chargerSettings.map((c) => [c.id, c.value]))
    expect(gel['charger-float']).toContain('13.8 V pack')
    expect(flooded['charger-float']).toContain('13.2 V pack')
  })

  it('the plan SOC floor turns the inverter off (monitor relay)', () => {
    const r = rulesFor('lfp').rules.find((x) => x.id === 'inverter-low-soc')!
    expect(r.condition).toBe('State of charge below 10 %') // LFP preset floor 0.1
  })
})

describe('overrides', () => {
  it('an override wins and is named "your setting"; the rest keep their source', () => {
    const t = resolveThresholds(resolveBattery(testVan('lfp').battery), { cellChargeCutoffV: 3.6 })
    expect(t.cellChargeCutoffV).toMatchObject({ value: 3.6, source: 'your setting', overridden: true })
    expect(t.cellLoadCutoffV.overridden).toBe(false)
  })

  it('names thresholds that contradict each other', () => {
    const p = protectionRules(resolveBattery(testVan('lfp').battery), {
      cellChargeReconnectV: 3.7,
      heaterOffAboveC: 1,
    })
    expect(p.issues.cellChargeReconnectV).toMatch(/below/)
    expect(p.issues.heaterOffAboveC).toMatch(/above/)
  })
})

describe('heater thresholds show up in the rules', () => {
  it('changing the plan heater changes the rules', () => {
    const plan = testVan('lfp')
    plan.battery.heater = { powerW: 60, onBelowC: 5, offAboveC: 9 }
    const p = protectionRules(resolveBattery(plan.battery))
    expect(p.rules.find((r) => r.id === 'heater-on')!.condition).toBe('Pack colder than 5 °C')
    expect(p.rules.find((r) => r.id === 'heater-off')!.condition).toBe('Pack warmer than 9 °C')
    expect(p.rules.find((r) => r.id === 'heater-on')!.device).toContain('60 W')
  })

  it('a heater override changes the rules, the checklist and the diagram', () => {
    const before = computeBuildSheet({ plan: testVan('lfp') })
    const after = computeBuildSheet({
      plan: testVan('lfp'),
      protection: { heaterOnBelowC: 2, heaterOffAboveC: 8 },
    })
    expect(before.protection.rules.find((r) => r.id === 'heater-on')!.condition).toBe('Pack colder than 3 °C')
    expect(after.protection.rules.find((r) => r.id === 'heater-on')!.condition).toBe('Pack colder than 2 °C')
    expect(after.protection.rules.find((r) => r.id === 'heater-off')!.condition).toBe('Pack warmer than 8 °C')
    const heaterItems = after.checklist.find((g) => g.id === 'heater')!.items
    expect(heaterItems.map((i) => i.text).join(' ')).toContain('2 °C')
    expect(heaterItems[0]!.source).toBe('your setting')
    expect(after.diagram.nodes.find((n) => n.id === 'heater')!.details.join(' ')).toContain(
      'on < 2 °C, off > 8 °C',
    )
  })
})
