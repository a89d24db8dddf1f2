/** Helpers for the vehicle and scenario API tests (tests/api/vehicles*.test.ts, scenarios*.test.ts). */
import request from 'supertest'
import type { Express } from 'express'
import type { AppContext } from '../../server/context'
import { vehicleMemberships } from '../../server/db/schema/index'
import type { VehicleRole } from '../../shared/schemas/vehicles'
import type { Trip } from '../../shared/schemas/plan'
import type { TestUser } from '../support/factories'

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete'

/** `call(user)('post', '/api/…', body)` → supertest response, with the user's session cookie (or none). */
export function caller(app: Express) {
  return (user: TestUser | null) => (method: Method, path: string, body?: unknown) => {
    let req = request(app)[method](path)
    if (user) req = req.set('Cookie', user.cookie)
    return body === undefined ? req : req.send(body as object)
  }
}

/** Give a user a role on a vehicle straight in the database (invitations are another issue's). */
export async function addMember(ctx: AppContext, vehicleId: string, userId: string, role: VehicleRole) {
  await ctx.db.insert(vehicleMemberships).values({ vehicleId, userId, role })
}

export const vehicleInput = { name: 'Test van', kind: 'van', systemVoltageV: 12 } as const

export const fridge = {
  name: 'Compressor fridge',
  category: 'fridge',
  powerW: 45,
  supply: 'dc',
  quantity: 1,
  dutyCycleFraction: 0.3,
  hoursPerDay: 24,
  startHour: 0,
  endHour: 0,
} as const

export const laptop = {
  name: 'Laptop',
  category: 'electronics',
  powerW: 60,
  supply: 'ac',
  quantity: 1,
  hoursPerDay: 3,
  startHour: 17,
  endHour: 22,
} as const

export const lfpBattery = { chemistry: 'lfp', cellsSeries: 4, cellsParallel: 1, capacityAh: 200 } as const

export const inverter = { ratedW: 1500, alwaysOn: false, onStartHour: 17, onEndHour: 22 } as const

export const solar = {
  kind: 'solar',
  name: 'Roof panels',
  peakPowerWp: 400,
  tiltDeg: 0,
  controller: 'mppt',
  maxCurrentA: 30,
} as const

export const winterTrip: Trip = {
  startDate: '2027-02-08',
  days: 3,
  latitudeDeg: 68.23,
  longitudeDeg: 14.57,
  timeZone: 'Europe/Oslo',
  sky: 'mixed',
  nightLowC: -9,
  dayHighC: -2,
  startSocFraction: 0.9,
  dayPlan: {
    kind: 'days',
    days: [
      { drivingHours: 2, hookup: false },
      { drivingHours: 0, hookup: false },
      { drivingHours: 0, hookup: true },
    ],
  },
}
