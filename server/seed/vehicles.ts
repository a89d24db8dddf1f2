/**
 * Demo vehicle (invented): Ines and Tomas share one high-roof van with a 200 Ah LFP pack, and keep two
 * scenarios for it: a sub-zero winter week in Lofoten and a summer month in Andalusia. Equipment follows
 * the engine's example data/examples/winter-week-lofoten.json. Made through the services, so the demo
 * history shows who added what.
 */
import { and, eq } from 'drizzle-orm'
import type { Trip } from '../../shared/schemas/plan'
import type { ApplianceCreate, ChargeSourceCreate, ScenarioUsage } from '../../shared/schemas/vehicles'
import type { Db } from '../db/client'
import { users, vehicleMemberships } from '../db/schema/index'
import { createScenario } from '../modules/scenarios/scenarios.service'
import { createAppliance } from '../modules/vehicles/appliances.service'
import { putBattery, putInverter } from '../modules/vehicles/equipment.service'
import type { Actor } from '../modules/vehicles/records'
import { createSource } from '../modules/vehicles/sources.service'
import { createVehicle } from '../modules/vehicles/vehicles.service'

const APPLIANCES: Record<string, ApplianceCreate> = {
  fridge: {
    name: 'Compressor fridge 50 L',
    category: 'fridge',
    powerW: 45,
    supply: 'dc',
    quantity: 1,
    dutyCycleFraction: 0.25,
    hoursPerDay: 24,
    startHour: 0,
    endHour: 0,
  },
  heater: {
    name: 'Diesel air heater fan and pump',
    category: 'heating',
    powerW: 20,
    supply: 'dc',
    quantity: 1,
    hoursPerDay: 14,
    startHour: 16,
    endHour: 8,
  },
  lights: {
    name: 'LED strip lights',
    category: 'lighting',
    powerW: 4,
    supply: 'dc',
    quantity: 4,
    hoursPerDay: 6,
    startHour: 15,
    endHour: 23,
  },
  fan: {
    name: 'Roof vent fan',
    category: 'ventilation',
    powerW: 12,
    supply: 'dc',
    quantity: 1,
    hoursPerDay: 1,
    startHour: 18,
    endHour: 22,
  },
  pump: {
    name: 'Water pump',
    category: 'water',
    powerW: 50,
    supply: 'dc',
    quantity: 1,
    hoursPerDay: 0.2,
    startHour: 7,
    endHour: 21,
  },
  phones: {
    name: 'Phone charging',
    category: 'electronics',
    powerW: 10,
    supply: 'dc',
    quantity: 2,
    hoursPerDay: 2,
    startHour: 19,
    endHour: 23,
  },
  router: {
    name: 'Mobile router',
    category: 'electronics',
    powerW: 8,
    supply: 'dc',
    quantity: 1,
    hoursPerDay: 8,
    startHour: 9,
    endHour: 23,
  },
  laptop: {
    name: 'Laptop',
    category: 'electronics',
    powerW: 60,
    supply: 'ac',
    quantity: 1,
    hoursPerDay: 3,
    startHour: 17,
    endHour: 22,
  },
  hob: {
    name: 'Induction hob',
    category: 'cooking',
    powerW: 1800,
    supply: 'ac',
    quantity: 1,
    hoursPerDay: 0.25,
    startHour: 18,
    endHour: 19,
  },
}

const SOURCES: ChargeSourceCreate[] = [
  {
    kind: 'solar',
    name: 'Roof panels 2 × 200 Wp',
    peakPowerWp: 400,
    tiltDeg: 0,
    azimuthDeg: 180,
    controller: 'mppt',
    maxCurrentA: 30,
  },
  { kind: 'dcdc', name: 'DC-DC charger 30 A', currentA: 30, efficiencyFraction: 0.92 },
  { kind: 'shore', name: 'Mains charger 20 A', currentA: 20 },
]

const WINTER_TRIP: Trip = {
  startDate: '2027-02-08',
  days: 7,
  latitudeDeg: 68.2343,
  longitudeDeg: 14.5681,
  timeZone: 'Europe/Oslo',
  sky: 'mixed',
  nightLowC: -9,
  dayHighC: -2,
  startSocFraction: 0.9,
  groundAlbedoFraction: 0.7,
  dayPlan: {
    kind: 'days',
    days: [
      { drivingHours: 3, drivingStartHour: 10, hookup: false },
      { drivingHours: 0, hookup: false },
      { drivingHours: 0, hookup: false },
      { drivingHours: 2, drivingStartHour: 11, hookup: false },
      { drivingHours: 0, hookup: true },
      { drivingHours: 0, hookup: false },
      { drivingHours: 4, drivingStartHour: 9, hookup: false },
    ],
  },
}

const parked = { drivingHours: 0, hookup: false }
const SUMMER_TRIP: Trip = {
  startDate: '2027-07-01',
  days: 31,
  latitudeDeg: 36.7202,
  longitudeDeg: -4.4203,
  timeZone: 'Europe/Madrid',
  sky: 'clear',
  nightLowC: 20,
  dayHighC: 33,
  startSocFraction: 0.9,
  dayPlan: {
    kind: 'week',
    // Monday to Sunday: a short drive to the next beach twice a week, a campsite with hook-up on Saturdays.
    days: [
      { drivingHours: 1.5, drivingStartHour: 9, hookup: false },
      parked,
      parked,
      { drivingHours: 2, drivingStartHour: 9, hookup: false },
      parked,
      { drivingHours: 0, hookup: true },
      parked,
    ],
  },
}

export async function seedVehicles(db: Db): Promise<void> {
  const people = await db.select({ id: users.id, displayName: users.displayName }).from(users)
  const ines: Actor | undefined = people.find((p) => p.id === 'demo-ines')
  const tomas: Actor | undefined = people.find((p) => p.id === 'demo-tomas')
  if (!ines || !tomas) return
  const already = await db
    .select({ id: vehicleMemberships.id })
    .from(vehicleMemberships)
    .where(and(eq(vehicleMemberships.userId, ines.id), eq(vehicleMemberships.role, 'owner')))
    .limit(1)
  if (already.length > 0) return

  const van = await createVehicle(db, ines, {
    name: 'Lingon, our high-roof van',
    kind: 'van',
    systemVoltageV: 12,
    notes:
      'Invented demo vehicle. 200 Ah LFP under the passenger seat in a 25 mm PIR box with a 40 W heater pad.',
  })
  await db
    .insert(vehicleMemberships)
    .values({ vehicleId: van.id, userId: tomas.id, role: 'editor', updatedBy: ines.id })

  await putBattery(db, ines, van.id, {
    version: 0,
    battery: {
      chemistry: 'lfp',
      cellsSeries: 4,
      cellsParallel: 1,
      cellCapacityAh: 200,
      socFloorFraction: 0.1,
      socCeilingFraction: 1,
      massKg: 22,
      enclosure: { areaM2: 0.5, thicknessM: 0.025, conductivityWPerMK: 0.025 },
      heater: { powerW: 40, onBelowC: 3, offAboveC: 6 },
      bmsSelfConsumptionW: 0.5,
    },
  })
  await putInverter(db, tomas, van.id, {
    version: 0,
    inverter: {
      ratedW: 2000,
      efficiencyFraction: 0.9,
      idleW: 12,
      alwaysOn: false,
      onStartHour: 17,
      onEndHour: 22,
    },
  })
  const ids: Record<string, string> = {}
  for (const [key, appliance] of Object.entries(APPLIANCES)) {
    ids[key] = (
      await createAppliance(db, key === 'router' || key === 'laptop' ? tomas : ines, van.id, appliance)
    ).id
  }
  for (const source of SOURCES) await createSource(db, tomas, van.id, source)

  const winterUsage: ScenarioUsage = { [ids.hob!]: { enabled: false } }
  await createScenario(db, ines, van.id, {
    name: 'Winter week in Lofoten',
    placeName: 'Svolvær, NO',
    notes: 'Cold nights: the heater pad keeps the cells chargeable. No cooking on the hob.',
    trip: WINTER_TRIP,
    usage: winterUsage,
  })
  const summerUsage: ScenarioUsage = {
    [ids.heater!]: { enabled: false },
    [ids.fridge!]: { dutyCycleFraction: 0.45 },
    [ids.fan!]: { hoursPerDay: 10, startHour: 12, endHour: 24 },
    [ids.lights!]: { hoursPerDay: 3, startHour: 20, endHour: 24 },
    [ids.hob!]: { hoursPerDay: 0.3 },
  }
  await createScenario(db, tomas, van.id, {
    name: 'Summer month on the Costa del Sol',
    placeName: 'Málaga, ES',
    notes: 'Hot days: the fridge runs more, the fan runs all afternoon, no heating.',
    trip: SUMMER_TRIP,
    usage: summerUsage,
  })
}
