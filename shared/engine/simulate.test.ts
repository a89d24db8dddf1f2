import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import winterWeek from '../../data/examples/winter-week-lofoten.json'
import summerMonth from '../../data/examples/summer-month-andalusia.json'
import cabinAutumn from '../../data/examples/cabin-autumn-overcast.json'
import {
  parsePlan,
  simulate,
  analysePlan,
  resultsToJson,
  fillPlanDefaults,
  prepareTrip,
  runPack,
  SOLAR_FULL_TOLERANCE_FRACTION,
  type Plan,
} from './index.ts'
import { expectClose } from './testing.ts'

// Every file in data/examples is also run through the command line by tests/engine/cli.test.ts.
const EXAMPLES: Record<string, unknown> = {
  'winter-week-lofoten.json': winterWeek,
  'summer-month-andalusia.json': summerMonth,
  'cabin-autumn-overcast.json': cabinAutumn,
}

function load(file: string): Plan {
  const r = parsePlan(JSON.parse(JSON.stringify(EXAMPLES[file])))
  if (!r.ok) throw new Error(JSON.stringify(r.fields))
  return r.plan
}

// ---------------------------------------------------------------------------------------------
// Random valid plans for the property tests (short trips keep them quick).
// ---------------------------------------------------------------------------------------------
const dayEntry = fc.record({
  drivingHours: fc.integer({ min: 0, max: 6 }),
  drivingStartHour: fc.integer({ min: 0, max: 20 }),
  hookup: fc.boolean(),
  generatorHours: fc.integer({ min: 0, max: 4 }),
})
const appliance = (i: number) =>
  fc
    .record({
      category: fc.constantFrom(
        'fridge',
        'lighting',
        'cooking',
        'heating',
        'electronics',
        'water',
        'ventilation',
        'other',
      ),
      powerW: fc.double({ min: 0, max: 1500, noNaN: true }),
      supply: fc.constantFrom('dc', 'ac'),
      quantity: fc.integer({ min: 0, max: 3 }),
      dutyCycleFraction: fc.double({ min: 0, max: 1, noNaN: true }),
      standbyW: fc.double({ min: 0, max: 5, noNaN: true }),
      startHour: fc.integer({ min: 0, max: 23 }),
      windowH: fc.integer({ min: 1, max: 24 }),
      onShare: fc.double({ min: 0, max: 1, noNaN: true }),
    })
    .map((a) => ({
      id: `a${i}`,
      name: `a${i}`,
      category: a.category,
      powerW: a.powerW,
      supply: a.supply,
      quantity: a.quantity,
      dutyCycleFraction: a.dutyCycleFraction,
      standbyW: a.standbyW,
      hoursPerDay: a.windowH * a.onShare,
      startHour: a.startHour,
      endHour: (a.startHour + a.windowH) % 24,
    }))

const planArb = fc
  .record({
    chemistry: fc.constantFrom('lfp', 'agm', 'gel', 'flooded'),
    cellsSeries: fc.constantFrom(4, 6, 8, 12, 16, 24),
    capacityAh: fc.integer({ min: 20, max: 600 }),
    floor: fc.double({ min: 0, max: 0.6, noNaN: true }),
    span: fc.double({ min: 0.1, max: 0.4, noNaN: true }),
    heater: fc.option(
      fc.record({ powerW: fc.integer({ min: 5, max: 80 }), onBelowC: fc.integer({ min: -5, max: 5 }) }),
      { nil: null },
    ),
    appliances: fc
      .array(fc.nat(), { minLength: 0, maxLength: 6 })
      .chain((xs) => fc.tuple(...xs.map((_, i) => appliance(i)))),
    solarWp: fc.integer({ min: 0, max: 1500 }),
    tilt: fc.integer({ min: 0, max: 90 }),
    azimuth: fc.integer({ min: 0, max: 359 }),
    controller: fc.constantFrom('mppt', 'pwm'),
    dcdcA: fc.integer({ min: 1, max: 60 }),
    shoreA: fc.integer({ min: 1, max: 40 }),
    days: fc.integer({ min: 1, max: 5 }),
    month: fc.integer({ min: 1, max: 12 }),
    lat: fc.double({ min: -70, max: 70, noNaN: true }),
    lon: fc.double({ min: -180, max: 180, noNaN: true }),
    tz: fc.constantFrom('UTC', 'Europe/Oslo', 'America/Denver', 'Australia/Sydney'),
    sky: fc.constantFrom('clear', 'mixed', 'overcast'),
    low: fc.integer({ min: -30, max: 25 }),
    swing: fc.integer({ min: 0, max: 15 }),
    startSoc: fc.double({ min: 0, max: 1, noNaN: true }),
    week: fc.array(dayEntry, { minLength: 7, maxLength: 7 }),
  })
  .map((r) => {
    const input = {
      battery: {
        chemistry: r.chemistry,
        cellsSeries: r.cellsSeries,
        cellsParallel: 1,
        capacityAh: r.capacityAh,
        socFloorFraction: r.floor,
        socCeilingFraction: Math.min(1, r.floor + r.span),
        heater: r.heater
          ? { powerW: r.heater.powerW, onBelowC: r.heater.onBelowC, offAboveC: r.heater.onBelowC + 3 }
          : null,
      },
      appliances: r.appliances,
      sources: [
        ...(r.solarWp > 0
          ? [
              {
                kind: 'solar',
                id: 's',
                name: 's',
                peakPowerWp: r.solarWp,
                tiltDeg: r.tilt,
                azimuthDeg: r.azimuth,
                controller: r.controller,
                maxCurrentA: 40,
              },
            ]
          : []),
        { kind: 'dcdc', id: 'd', name: 'd', currentA: r.dcdcA },
        { kind: 'shore', id: 'm', name: 'm', currentA: r.shoreA },
        { kind: 'generator', id: 'g', name: 'g', currentA: 15 },
      ],
      inverter: { ratedW: 1200, alwaysOn: false },
      trip: {
        startDate: `2027-${String(r.month).padStart(2, '0')}-10`,
        days: r.days,
        latitudeDeg: r.lat,
        longitudeDeg: r.lon,
        timeZone: r.tz,
        sky: r.sky,
        nightLowC: r.low,
        dayHighC: r.low + r.swing,
        startSocFraction: r.startSoc,
        dayPlan: { kind: 'week', days: r.week },
      },
    }
    const parsed = parsePlan(input)
    if (!parsed.ok) throw new Error(`generator made an invalid plan: ${JSON.stringify(parsed.fields)}`)
    return parsed.plan
  })

describe('simulate: conservation and limits (property-based, fast-check)', () => {
  // Energy balance (no empirical model): energy in − energy out − losses = change in stored energy.
  it('energy in − energy out − losses = change in stored energy, within 1e-6 relative', () => {
    fc.assert(
      fc.property(planArb, (plan) => {
        const r = simulate(plan)
        let inWh = 0
        let outWh = 0
        let lossWh = 0
        for (const d of r.days) {
          inWh += d.inWh.solar + d.inWh.dcdc + d.inWh.shore + d.inWh.generator
          outWh += Object.values(d.outWh).reduce((s, w) => s + w, 0)
          lossWh += d.packLossWh
        }
        const delta = r.totals.endStoredWh - r.totals.startStoredWh
        const scale = Math.max(1, inWh, outWh)
        expect(Math.abs(inWh - outWh - lossWh - delta)).toBeLessThanOrEqual(1e-6 * scale)
      }),
      { numRuns: 60 },
    )
  })

  it('keeps SOC within [floor, ceiling] (or within [start, ceiling] if it started below the floor)', () => {
    fc.assert(
      fc.property(planArb, (plan) => {
        const r = simulate(plan)
        const b = r.plan.battery
        const lo = Math.min(b.socFloorFraction, r.totals.startSocFraction) - 1e-9
        const hi = Math.max(b.socCeilingFraction, r.totals.startSocFraction) + 1e-9
        for (const soc of r.series.socEndFraction) {
          expect(soc).toBeGreaterThanOrEqual(lo)
          expect(soc).toBeLessThanOrEqual(hi)
        }
      }),
      { numRuns: 60 },
    )
  })

  it('never charges while the pack is below its charge minimum, and never returns NaN', () => {
    fc.assert(
      fc.property(planArb, (plan) => {
        const r = simulate(plan)
        const b = r.plan.battery
        const s = r.series
        let prevSoc = r.totals.startSocFraction
        for (let i = 0; i < r.hours; i++) {
          const soc = s.socEndFraction[i]!
          expect(Number.isFinite(soc)).toBe(true)
          if (s.packTempStartC[i]! < b.chargeMinC) {
            expect(soc).toBeLessThanOrEqual(prevSoc + 1e-12)
            // Sources may feed only the heater pad while the pack is too cold.
            const used =
              s.sourceW.solar[i]! + s.sourceW.dcdc[i]! + s.sourceW.shore[i]! + s.sourceW.generator[i]!
            expect(used).toBeLessThanOrEqual(s.loadW.heater[i]! + 1e-9)
          }
          prevSoc = soc
        }
      }),
      { numRuns: 60 },
    )
  })
})

describe('simulate: example plans', () => {
  const files = Object.keys(EXAMPLES)
  it('ships at least a winter week and a summer month', () => {
    expect(files.length).toBeGreaterThanOrEqual(2)
  })
  it.each(files)('%s simulates without NaN, one row per day', (file) => {
    const plan = load(file)
    const r = analysePlan(plan)
    expect(r.days.length).toBe(plan.trip.days)
    expect(r.series.socEndFraction.length).toBe(plan.trip.days * 24)
    const json = JSON.stringify(resultsToJson(r))
    expect(json).not.toMatch(/NaN|Infinity/)
  })

  it('the winter example has sub-zero nights at a northern latitude; the summer one lasts a month in the south', () => {
    const winter = load('winter-week-lofoten.json')
    expect(winter.trip.latitudeDeg).toBeGreaterThan(55)
    expect(winter.trip.nightLowC).toBeLessThan(0)
    expect(winter.trip.days).toBe(7)
    const summer = load('summer-month-andalusia.json')
    expect(summer.trip.latitudeDeg).toBeLessThan(45)
    expect(summer.trip.days).toBeGreaterThanOrEqual(28)
  })

  it('gives the same JSON on a second run (what the browser and server compare)', () => {
    const plan = load('winter-week-lofoten.json')
    expect(JSON.stringify(resultsToJson(analysePlan(plan)))).toBe(
      JSON.stringify(resultsToJson(analysePlan(plan))),
    )
  })

  it('day rows add up to the trip summary and the hourly series', () => {
    const r = simulate(load('summer-month-andalusia.json'))
    const solarFromDays = r.days.reduce((s, d) => s + d.inWh.solar, 0)
    const solarFromHours = r.series.sourceW.solar.reduce((s, w) => s + w, 0)
    expectClose(solarFromDays, r.summary.energyInWh.solar, 1e-6)
    expectClose(solarFromHours, r.summary.energyInWh.solar, 1e-6)
    expect(r.summary.lowestSocFraction).toBe(Math.min(...r.series.socEndFraction))
  })
})

describe('sizing answers', () => {
  it('pack needed is the smallest capacity with no shortage (one Ah less falls short)', () => {
    const plan = load('winter-week-lofoten.json')
    const a = analysePlan(plan)
    const need = a.packNeeded.capacityAh!
    expect(need).toBeGreaterThan(0)
    const prep = prepareTrip(fillPlanDefaults(plan))
    expect(runPack(prep, { capacityAh: need, record: false }).totals.shortageWh).toBeLessThanOrEqual(1e-6)
    expect(runPack(prep, { capacityAh: need - 1, record: false }).totals.shortageWh).toBeGreaterThan(1e-6)
  })

  it('solar needed serves every load and ends full or no lower than it started (and 1 Wp less does not)', () => {
    const plan = load('summer-month-andalusia.json')
    const a = analysePlan(plan)
    const wp = a.solarNeeded.peakPowerWp!
    expect(a.solarNeeded.capacityAh).toBe(a.plan.battery.capacityAh)
    const prep = prepareTrip(fillPlanDefaults(plan))
    const own = prep.plan.sources.solar.reduce((s, x) => s + x.peakPowerWp, 0)
    const ceiling = prep.plan.battery.socCeilingFraction
    const passes = (w: number) => {
      const t = runPack(prep, { solarScale: w / own, record: false }).totals
      return (
        t.shortageWh <= 1e-6 &&
        (t.finalSocFraction >= plan.trip.startSocFraction - 1e-9 ||
          t.lastDayHighestSocFraction >= ceiling - SOLAR_FULL_TOLERANCE_FRACTION - 1e-9)
      )
    }
    expect(passes(wp)).toBe(true)
    expect(passes(wp - 1)).toBe(false)
  })

  it('the winter van gets a solar figure, not “not reachable”', () => {
    const a = analysePlan(load('winter-week-lofoten.json'))
    expect(a.solarNeeded.peakPowerWp).toBeGreaterThan(0)
    expect(a.solarNeeded.reason).toBeNull()
  })

  it('autonomy counts the heater: a colder trip empties the same pack sooner', () => {
    const plan = load('winter-week-lofoten.json')
    const colder = { ...plan, trip: { ...plan.trip, nightLowC: -25, dayHighC: -18 } }
    const warm = { ...plan, trip: { ...plan.trip, nightLowC: 8, dayHighC: 14 } }
    expect(analysePlan(colder).autonomy.days!).toBeLessThan(analysePlan(warm).autonomy.days!)
  })
})
