import { describe, expect, it } from 'vitest'
import {
  COPPER_ALPHA_20C_PER_K,
  COPPER_RESISTIVITY_20C_OHM_MM2_PER_M,
  copperResistanceAtTempOhmPerKm,
  copperResistanceRatio,
  idealCopperResistance20COhmPerKm,
} from './copper.ts'
import { AWG_SIZES, IEC60228_CLASS2, IEC60228_CLASS5, awgAreaMm2, awgDiameterMm } from './conductors.ts'
import {
  abycCircularMils,
  circularMilsOfDiameterMm,
  sizeCable,
  voltageDropV,
  type CableRunInput,
} from './cable.ts'

describe('copper resistance and its temperature correction (IEC 60028)', () => {
  it('uses ρ20 = 0.017241 Ω·mm²/m and α20 = 0.00393 /K (IEC 60028, REFERENCES §7.1 [R])', () => {
    expect(COPPER_RESISTIVITY_20C_OHM_MM2_PER_M).toBe(0.017241)
    expect(COPPER_ALPHA_20C_PER_K).toBe(0.00393)
  })

  it.each([
    [-20, 0.8428],
    [0, 0.9214],
    [20, 1],
    [40, 1.0786],
    [60, 1.1572],
    [70, 1.1965],
    [90, 1.2751],
  ])('R(%d °C)/R20 = %d (REFERENCES §7.1 [C] from IEC 60028 α20)', (tempC, ratio) => {
    expect(copperResistanceRatio(tempC)).toBeCloseTo(ratio, 4)
  })

  it('corrects a table resistance: 6 mm² class 5 at 70 °C is 3.30 × 1.1965 Ω/km', () => {
    expect(copperResistanceAtTempOhmPerKm(3.3, 70)).toBeCloseTo(3.94845, 5)
  })

  it('gives ρ/A for ideal copper (REFERENCES §7.2 row "ρ20/A": 6 mm² → 2.873, 50 mm² → 0.345 Ω/km)', () => {
    expect(idealCopperResistance20COhmPerKm(6)).toBeCloseTo(2.8735, 3)
    expect(idealCopperResistance20COhmPerKm(50)).toBeCloseTo(0.3448, 3)
  })
})

describe('IEC 60228 tables (Table 2 class 2 stranded, Table 3 class 5 flexible)', () => {
  it('holds the transcribed values (REFERENCES §7.2 [R])', () => {
    const c5 = Object.fromEntries(IEC60228_CLASS5.map((c) => [c.areaMm2, c.resistance20COhmPerKm]))
    expect(c5).toMatchObject({ 1.5: 13.3, 2.5: 7.98, 4: 4.95, 6: 3.3, 10: 1.91, 16: 1.21, 25: 0.78 })
    const c2 = Object.fromEntries(IEC60228_CLASS2.map((c) => [c.areaMm2, c.resistance20COhmPerKm]))
    expect(c2).toMatchObject({ 1.5: 12.1, 10: 1.83, 50: 0.387, 95: 0.193, 240: 0.0754 })
  })

  it('every tabulated maximum lies 0–20 % above ρ20/A (stranding allowance, REFERENCES §7.2 note)', () => {
    for (const c of [...IEC60228_CLASS5, ...IEC60228_CLASS2]) {
      const ratio = c.resistance20COhmPerKm / idealCopperResistance20COhmPerKm(c.areaMm2)
      expect(ratio, `${c.areaMm2} mm²`).toBeGreaterThan(1)
      expect(ratio, `${c.areaMm2} mm²`).toBeLessThan(1.2)
    }
  })
})

describe('AWG by ASTM B258 (REFERENCES §7.3 [C])', () => {
  it.each([
    ['4/0', -3, 11.684, 107.22],
    ['1/0', 0, 8.251, 53.48],
    ['4', 4, 5.189, 21.15],
    ['10', 10, 2.588, 5.261],
    ['12', 12, 2.053, 3.309],
  ])('%s AWG: d = %d mm, A = %d mm²', (_label, n, d, a) => {
    expect(awgDiameterMm(n)).toBeCloseTo(d, 3)
    expect(awgAreaMm2(n)).toBeCloseTo(a, 2)
  })

  it('10 AWG has R20 = 3.2770 mΩ/m with ρ20 = 0.017241', () => {
    const awg10 = AWG_SIZES.find((s) => s.label === '10')!
    expect(awg10.resistance20COhmPerKm).toBeCloseTo(3.277, 3)
  })

  it('12 AWG is 6530 circular mils (REFERENCES §7.3)', () => {
    expect(circularMilsOfDiameterMm(awgDiameterMm(12))).toBeCloseTo(6530, -1)
  })
})

const run = (over: Partial<CableRunInput>): CableRunInput => ({
  oneWayLengthM: 5,
  currentA: 20,
  systemVoltageV: 12,
  maxDropFraction: 0.03,
  conductorTempC: 20,
  conductorClass: 'class5',
  insulationRatingC: 105,
  fuseA: null,
  ...over,
})

describe('voltage drop: worked example, 20 A over 5 m one way at 12 V (REFERENCES §7.4 [C])', () => {
  it('6 mm² class 5: R = 0.0330 Ω, ΔV = 0.660 V = 5.50 %; at 70 °C 0.790 V', () => {
    expect(voltageDropV(20, 5, 3.3, 20)).toBeCloseTo(0.66, 3)
    expect(voltageDropV(20, 5, 3.3, 20) / 12).toBeCloseTo(0.055, 4)
    expect(voltageDropV(20, 5, 3.3, 70)).toBeCloseTo(0.7897, 3)
  })

  it('10 mm² gives 0.382 V = 3.18 % and 16 mm² 0.242 V = 2.02 %', () => {
    expect(voltageDropV(20, 5, 1.91, 20)).toBeCloseTo(0.382, 3)
    expect(voltageDropV(20, 5, 1.21, 20) / 12).toBeCloseTo(0.0202, 4)
  })

  it('sizes 16 mm² at 3 % (10 mm² fails by the IEC table though ρ/A would pass at 9.58 mm²)', () => {
    const s = sizeCable(run({}))
    expect(s.metric?.areaMm2).toBe(16)
    expect(s.metric?.dropV).toBeCloseTo(0.242, 3)
    expect(s.metricSetByFuse).toBe(false)
  })

  it('sizes 4 mm² at 10 % (2.5 mm² gives 13.3 %)', () => {
    const s = sizeCable(run({ maxDropFraction: 0.1 }))
    expect(s.metric?.areaMm2).toBe(4)
    expect(s.metric?.dropFraction).toBeCloseTo(0.0825, 4)
  })

  it('a warmer conductor needs a bigger size: 4.7 m at 3 % is 10 mm² at 20 °C but 16 mm² at 70 °C', () => {
    // 10 mm² over 4.7 m one way: 20 °C → 20 × 1.91e-3 × 9.4 = 0.359 V (2.99 %); 70 °C → 0.430 V (3.58 %).
    expect(sizeCable(run({ oneWayLengthM: 4.7 })).metric?.areaMm2).toBe(10)
    expect(sizeCable(run({ oneWayLengthM: 4.7, conductorTempC: 70 })).metric?.areaMm2).toBe(16)
  })

  it('at 24 V the same drop is half the percentage: 6 mm² gives 2.75 % and passes 3 %', () => {
    const s = sizeCable(run({ systemVoltageV: 24 }))
    expect(s.metric?.areaMm2).toBe(6)
    expect(s.metric?.dropFraction).toBeCloseTo(0.0275, 4)
  })
})

describe('ABYC E-11 bilge-pump example: 10 A, 21 ft round trip, 3 % of 12 V (REFERENCES §7.4 [R]/[C])', () => {
  it('needs 6271 CM by CM = K·I·L/E, i.e. 12 AWG (6530 CM)', () => {
    expect(abycCircularMils(10, 21, 0.36)).toBeCloseTo(6271, 0)
  })

  it('our AWG sizing gives 12 AWG for the same run', () => {
    const oneWayM = (21 / 2) * 0.3048
    const s = sizeCable(run({ currentA: 10, oneWayLengthM: oneWayM, maxDropFraction: 0.03 }))
    expect(s.awg?.label).toBe('12')
  })
})

describe('the fuse protects the cable', () => {
  it('raises the size when the fuse is larger than the drop-sized cable can carry', () => {
    // 20 A over 0.5 m: 1.5 mm² passes on drop, but a 60 A fuse needs ≥ 60 A ampacity → 6 mm² at 105 °C.
    const s = sizeCable(run({ oneWayLengthM: 0.5, fuseA: 60 }))
    expect(s.metricByDropMm2).toBe(1.5)
    expect(s.metric?.areaMm2).toBe(6)
    expect(s.metricSetByFuse).toBe(true)
    expect(s.fuseProtectsCable).toBe(true)
    expect(s.metric?.ampacityA).toBeGreaterThanOrEqual(60)
  })

  it('never goes below 16 AWG / 1.5 mm² (ABYC E-11 minimum, REFERENCES §7.4 [R])', () => {
    const s = sizeCable(run({ currentA: 0.5, oneWayLengthM: 1, fuseA: 1 }))
    expect(s.metric?.areaMm2).toBe(1.5)
    expect(s.awg?.label).toBe('16')
  })

  it('reports no size when nothing in the table fits', () => {
    const s = sizeCable(run({ currentA: 600, oneWayLengthM: 10, fuseA: 800 }))
    expect(s.metric).toBeNull()
    expect(s.fuseProtectsCable).toBe(false)
  })
})
