import { describe, expect, it } from 'vitest'
import { computeBuildSheet } from './sheet.ts'
import { testVan } from './testPlans.ts'

describe('ratings from the plan (energy balance I = P/V; margin 125 %, REFERENCES §7.5 [CP])', () => {
  const s = computeBuildSheet({ plan: testVan() })
  const r = s.ratings

  it('adds every charge source at full output', () => {
    expect(r.totalChargeA).toBe(60) // 30 A solar controller + 30 A DC-DC
    expect(r.chargeDisconnect).toEqual({ continuousA: 60, requiredA: 75, ratingA: 80 })
  })

  it('computes the inverter DC current at the inverter-off voltage, with its surge', () => {
    // 1500 W ÷ (0.9 × 2.9 V × 4) = 143.68 A; surge 3000 W → 287.36 A
    expect(r.lowVoltageV).toBeCloseTo(11.6, 6)
    expect(r.inverter!.continuousA).toBeCloseTo(143.678, 2)
    expect(r.inverter!.surgeA).toBeCloseTo(287.356, 2)
  })

  it('adds DC loads at the nominal voltage and the heater pad', () => {
    // fridge 48 W + lights 6 × 4 W = 72 W ÷ 12.8 V = 5.625 A; heater 40 W ÷ 12.8 V = 3.125 A
    expect(r.dcLoadA).toBeCloseTo(5.625, 6)
    expect(r.heaterA).toBeCloseTo(3.125, 6)
    expect(r.maxLoadA).toBeCloseTo(5.625 + 3.125 + 143.678, 2)
    expect(r.loadDisconnect.ratingA).toBe(200) // 152.43 × 1.25 = 190.5 → 200
    expect(r.mainFuse.ratingA).toBe(200)
  })

  it("gives the pack's continuous and burst current as C-rates (LFP preset 1C, burst 2× [CP])", () => {
    expect(r.pack.continuousA).toBe(200)
    expect(r.pack.continuousC).toBe(1)
    expect(r.pack.burstA).toBe(400)
    expect(r.pack.maxChargeC).toBe(0.5)
  })

  it('warns when all chargers exceed what the pack may take', () => {
    const plan = testVan()
    plan.battery.maxChargeCurrentA = 50
    const w = computeBuildSheet({ plan }).ratings.warnings
    expect(w.join(' ')).toMatch(/60 A, more than the 50 A/)
  })

  it('names the margin rule', () => {
    expect(s.marginRule).toMatch(/125 %/)
  })
})

describe('cable runs', () => {
  it('has one run per wire pair and sizes each; the fuse protects every sized cable', () => {
    const s = computeBuildSheet({ plan: testVan() })
    const ids = s.cableRuns.map((c) => c.id)
    expect(ids).toEqual([
      'main',
      'source:roof',
      'source:dcdc',
      'inverter',
      'dc-panel',
      'heater',
      'load:fridge',
      'load:lights',
    ])
    for (const run of s.cableRuns) {
      expect(run.sizing.metric, run.id).not.toBeNull()
      expect(run.sizing.fuseProtectsCable, run.id).toBe(true)
    }
  })

  it('a longer run gets a larger cable', () => {
    const short = computeBuildSheet({ plan: testVan() }).cableRuns.find((c) => c.id === 'source:dcdc')!
    const long = computeBuildSheet({
      plan: testVan(),
      cableRuns: { 'source:dcdc': { oneWayLengthM: 6 } },
    }).cableRuns.find((c) => c.id === 'source:dcdc')!
    expect(long.oneWayLengthM).toBe(6)
    expect(long.edited).toEqual(['oneWayLengthM'])
    expect(long.sizing.metric!.areaMm2).toBeGreaterThan(short.sizing.metric!.areaMm2)
    // 30 A over 6 m at 50 °C, 3 % of 12.8 V = 0.384 V: 25 mm² gives 30 × 0.78e-3 × 1.1179 × 12 = 0.314 V
    expect(long.sizing.metric!.areaMm2).toBe(25)
  })

  it('lighting is non-critical (10 %), the fridge critical (3 %)', () => {
    const s = computeBuildSheet({ plan: testVan() })
    expect(s.cableRuns.find((c) => c.id === 'load:lights')!.maxDropPercent).toBe(10)
    expect(s.cableRuns.find((c) => c.id === 'load:fridge')!.maxDropPercent).toBe(3)
  })
})

describe('the rest of the sheet', () => {
  it('compares chemistries with the engine and gives usable energy', () => {
    const s = computeBuildSheet({ plan: testVan() })
    expect(s.usableKWh).toBeCloseTo(2.304, 6) // 200 Ah × 12.8 V × 0.9
    expect(s.chemistry.map((c) => c.chemistry)).toEqual(['lfp', 'agm', 'gel', 'flooded'])
  })

  it('puts the cautions where the risk is', () => {
    const s = computeBuildSheet({ plan: testVan() })
    const near = Object.fromEntries(s.cautions.map((c) => [c.id, c.near]))
    expect(near).toMatchObject({
      fire: 'top',
      lithium: 'protection',
      'fuse-close': 'ratings',
      heater: 'heater',
      codes: 'top',
    })
  })

  it('lists every rule, device and cable in the checklist with stable ids', () => {
    const s = computeBuildSheet({ plan: testVan() })
    const ids = s.checklist.flatMap((g) => g.items.map((i) => i.id))
    expect(new Set(ids).size).toBe(ids.length)
    expect(ids).toEqual(
      expect.arrayContaining(['rule:charge-too-cold', 'rule:heater-on', 'device:main-fuse', 'cable:main']),
    )
    expect(ids.filter((i) => i.startsWith('rule:'))).toHaveLength(s.protection.rules.length)
    expect(ids.filter((i) => i.startsWith('cable:'))).toHaveLength(s.cableRuns.length)
  })
})
