/**
 * Invented plans for the build-sheet tests (not real vehicles or products).
 */
import type { Chemistry, Plan } from '../schemas/plan.ts'

/** A 12 V van: 4S 200 Ah LFP with a 40 W pad, 2 DC loads, an inverter, solar and a DC-DC charger. */
export function testVan(chemistry: Chemistry = 'lfp'): Plan {
  const lithium = chemistry === 'lfp'
  return {
    name: 'Test van',
    battery: {
      chemistry,
      cellsSeries: lithium ? 4 : 6,
      cellsParallel: 1,
      capacityAh: 200,
      ...(lithium ? { heater: { powerW: 40, onBelowC: 3, offAboveC: 6 } } : {}),
    },
    appliances: [
      {
        id: 'fridge',
        name: 'Fridge',
        category: 'fridge',
        powerW: 48,
        supply: 'dc',
        quantity: 1,
        hoursPerDay: 24,
        startHour: 0,
        endHour: 0,
      },
      {
        id: 'lights',
        name: 'Lights',
        category: 'lighting',
        powerW: 4,
        supply: 'dc',
        quantity: 6,
        hoursPerDay: 5,
        startHour: 17,
        endHour: 23,
      },
      {
        id: 'laptop',
        name: 'Laptop',
        category: 'electronics',
        powerW: 60,
        supply: 'ac',
        quantity: 1,
        hoursPerDay: 3,
        startHour: 17,
        endHour: 22,
      },
    ],
    sources: [
      {
        kind: 'solar',
        id: 'roof',
        name: 'Roof solar',
        peakPowerWp: 400,
        controller: 'mppt',
        maxCurrentA: 30,
      },
      { kind: 'dcdc', id: 'dcdc', name: 'DC-DC', currentA: 30 },
    ],
    inverter: { ratedW: 1500, surgeW: 3000, efficiencyFraction: 0.9, alwaysOn: false },
    trip: {
      startDate: '2026-01-10',
      days: 3,
      latitudeDeg: 60,
      longitudeDeg: 10,
      timeZone: 'Europe/Oslo',
      sky: 'overcast',
      nightLowC: -10,
      dayHighC: -2,
      startSocFraction: 1,
      dayPlan: { kind: 'week', days: Array.from({ length: 7 }, () => ({ drivingHours: 1, hookup: false })) },
    },
  }
}
