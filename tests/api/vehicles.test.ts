/**
 * /api/vehicles and the vehicle's equipment: create/read/update/delete for each entity, field-named
 * validation errors, optimistic concurrency (stale version → 409, row unchanged) and the change history.
 * Roles are in vehicles-roles.test.ts, CSV in vehicles-csv.test.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import {
  ApplianceRecordSchema,
  BatteryRecordSchema,
  ChargeSourceRecordSchema,
  HistoryListSchema,
  InverterRecordSchema,
  VehicleDetailSchema,
  VehicleListSchema,
} from '../../shared/schemas/vehicles'
import {
  addMember,
  caller,
  fridge,
  inverter,
  laptop,
  lfpBattery,
  solar,
  vehicleInput,
} from './vehicles.fixtures'

const ctx = testContext()
const app = createApp(ctx)
const call = caller(app)
let ines: TestUser
let tomas: TestUser
let as: ReturnType<typeof call>

beforeAll(async () => {
  ines = await createUser(ctx, { displayName: 'Ines Test' })
  tomas = await createUser(ctx)
  as = call(ines)
})
afterAll(() => ctx.pool.end())

async function newVehicle(name = 'Van'): Promise<string> {
  const res = await as('post', '/api/vehicles', { ...vehicleInput, name }).expect(201)
  return res.body.id
}

describe('vehicles', () => {
  it('requires a session (401)', async () => {
    const res = await call(null)('get', '/api/vehicles').expect(401)
    expect(res.body.error.code).toBe('unauthorized')
  })

  it('creates a vehicle with me as owner, lists and reads it', async () => {
    const created = await as('post', '/api/vehicles', { ...vehicleInput, notes: 'two seats' }).expect(201)
    const v = VehicleDetailSchema.parse(created.body)
    expect(v).toMatchObject({
      name: 'Test van',
      kind: 'van',
      systemVoltageV: 12,
      notes: 'two seats',
      myRole: 'owner',
      version: 1,
    })
    expect(v.members).toEqual([
      expect.objectContaining({ userId: ines.id, role: 'owner', displayName: 'Ines Test' }),
    ])
    expect(v.updatedBy).toEqual({ id: ines.id, displayName: 'Ines Test' })

    const list = VehicleListSchema.parse((await as('get', '/api/vehicles').expect(200)).body)
    expect(list.items.map((i) => i.id)).toContain(v.id)
    expect(list.items.find((i) => i.id === v.id)?.myRole).toBe('owner')

    const got = VehicleDetailSchema.parse((await as('get', `/api/vehicles/${v.id}`).expect(200)).body)
    expect(got.id).toBe(v.id)
  })

  it('paginates the list', async () => {
    const me = await createUser(ctx)
    for (const name of ['A', 'B', 'C'])
      await call(me)('post', '/api/vehicles', { ...vehicleInput, name }).expect(201)
    const page = VehicleListSchema.parse(
      (await call(me)('get', '/api/vehicles?limit=2&offset=0').expect(200)).body,
    )
    expect(page).toMatchObject({ total: 3, limit: 2, offset: 0 })
    expect(page.items).toHaveLength(2)
    const rest = VehicleListSchema.parse(
      (await call(me)('get', '/api/vehicles?limit=2&offset=2').expect(200)).body,
    )
    expect(rest.items).toHaveLength(1)
    expect(rest.total).toBe(3)
    // Past the last page: no rows, and still the right total.
    const past = VehicleListSchema.parse(
      (await call(me)('get', '/api/vehicles?limit=2&offset=10').expect(200)).body,
    )
    expect(past).toMatchObject({ items: [], total: 3, offset: 10 })
    expect(page.items[0]!.updatedBy).toEqual({ id: me.id, displayName: me.displayName })
    const bad = await call(me)('get', '/api/vehicles?limit=500').expect(400)
    expect(Object.keys(bad.body.error.fields)).toEqual(['limit'])
  })

  it('names each invalid field (400)', async () => {
    const res = await as('post', '/api/vehicles', {
      name: '',
      kind: 'car',
      systemVoltageV: 13,
      colour: 'red',
    }).expect(400)
    expect(res.body.error.code).toBe('validation_failed')
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['colour', 'kind', 'name', 'systemVoltageV'])
    expect(res.body.error.fields.systemVoltageV).toEqual(['must be 12, 24 or 48'])
    expect(res.body.error.fields.colour).toEqual(['is not a known field'])
  })

  it('answers 404 for a vehicle I am not a member of, and for a malformed id', async () => {
    const id = await newVehicle()
    const res = await call(tomas)('get', `/api/vehicles/${id}`).expect(404)
    expect(res.body.error.code).toBe('not_found')
    await as('get', '/api/vehicles/not-a-uuid').expect(404)
    await as('get', '/api/vehicles/00000000-0000-4000-8000-000000000000').expect(404)
  })

  it('updates with the current version and refuses a stale one with 409 and the current row', async () => {
    const id = await newVehicle('Before')
    const ok = await as('patch', `/api/vehicles/${id}`, {
      version: 1,
      name: 'After',
      systemVoltageV: 24,
    }).expect(200)
    expect(ok.body).toMatchObject({ name: 'After', systemVoltageV: 24, version: 2 })

    const stale = await as('patch', `/api/vehicles/${id}`, { version: 1, name: 'Lost edit' }).expect(409)
    expect(stale.body.error.code).toBe('conflict')
    expect(stale.body.error.current).toMatchObject({ id, name: 'After', version: 2 })
    const now = await as('get', `/api/vehicles/${id}`).expect(200)
    expect(now.body).toMatchObject({ name: 'After', version: 2 })
  })

  it('requires the version on update and delete (400 names it)', async () => {
    const id = await newVehicle()
    const res = await as('patch', `/api/vehicles/${id}`, { name: 'x' }).expect(400)
    expect(res.body.error.fields.version).toEqual(['is required'])
    const del = await as('delete', `/api/vehicles/${id}`).expect(400)
    expect(Object.keys(del.body.error.fields)).toEqual(['version'])
  })

  it('deletes with the current version only', async () => {
    const id = await newVehicle()
    await as('patch', `/api/vehicles/${id}`, { version: 1, notes: 'changed' }).expect(200)
    const stale = await as('delete', `/api/vehicles/${id}?version=1`).expect(409)
    expect(stale.body.error.current.version).toBe(2)
    await as('get', `/api/vehicles/${id}`).expect(200)
    await as('delete', `/api/vehicles/${id}?version=2`).expect(204)
    await as('get', `/api/vehicles/${id}`).expect(404)
  })
})

describe('battery bank', () => {
  it('is empty (version 0) until saved, then created, updated, and stale writes refused', async () => {
    const id = await newVehicle()
    const empty = BatteryRecordSchema.parse((await as('get', `/api/vehicles/${id}/battery`).expect(200)).body)
    expect(empty).toMatchObject({ battery: null, version: 0, updatedBy: null })

    const created = await as('put', `/api/vehicles/${id}/battery`, {
      version: 0,
      battery: lfpBattery,
    }).expect(200)
    expect(BatteryRecordSchema.parse(created.body)).toMatchObject({ battery: lfpBattery, version: 1 })

    const again = await as('put', `/api/vehicles/${id}/battery`, {
      version: 0,
      battery: { ...lfpBattery, capacityAh: 50 },
    }).expect(409)
    expect(again.body.error.current).toMatchObject({ version: 1, battery: { capacityAh: 200 } })

    const updated = await as('put', `/api/vehicles/${id}/battery`, {
      version: 1,
      battery: { ...lfpBattery, capacityAh: 300 },
    }).expect(200)
    expect(updated.body).toMatchObject({ version: 2, battery: { capacityAh: 300 } })

    await as('put', `/api/vehicles/${id}/battery`, {
      version: 1,
      battery: { ...lfpBattery, capacityAh: 100 },
    }).expect(409)
    const now = await as('get', `/api/vehicles/${id}/battery`).expect(200)
    expect(now.body).toMatchObject({ version: 2, battery: { capacityAh: 300 } })
  })

  it('names the invalid battery fields', async () => {
    const id = await newVehicle()
    const res = await as('put', `/api/vehicles/${id}/battery`, {
      version: 0,
      battery: {
        chemistry: 'lfp',
        cellsSeries: 0,
        cellsParallel: 1,
        socFloorFraction: 0.5,
        socCeilingFraction: 0.4,
      },
    }).expect(400)
    const fields = res.body.error.fields
    expect(fields['battery.cellsSeries']).toEqual(['must be at least 1'])
    expect(fields['battery.capacityAh']).toEqual(['give capacityAh or cellCapacityAh'])
    await as('get', `/api/vehicles/${id}/battery`)
      .expect(200)
      .expect((r) => expect(r.body.battery).toBeNull())
  })
})

describe('inverter', () => {
  it('adds, changes and removes the inverter with versions', async () => {
    const id = await newVehicle()
    expect(
      InverterRecordSchema.parse((await as('get', `/api/vehicles/${id}/inverter`).expect(200)).body).version,
    ).toBe(0)
    await as('put', `/api/vehicles/${id}/inverter`, { version: 0, inverter }).expect(200)
    const changed = await as('put', `/api/vehicles/${id}/inverter`, {
      version: 1,
      inverter: { ...inverter, ratedW: 2000 },
    }).expect(200)
    expect(changed.body).toMatchObject({ version: 2, inverter: { ratedW: 2000 } })
    const bad = await as('put', `/api/vehicles/${id}/inverter`, {
      version: 2,
      inverter: { ...inverter, ratedW: -1 },
    }).expect(400)
    expect(Object.keys(bad.body.error.fields)).toEqual(['inverter.ratedW'])
    await as('put', `/api/vehicles/${id}/inverter`, { version: 1, inverter: null }).expect(409)
    const removed = await as('put', `/api/vehicles/${id}/inverter`, { version: 2, inverter: null }).expect(
      200,
    )
    expect(removed.body).toMatchObject({ version: 3, inverter: null })
  })
})

describe('appliances', () => {
  it('adds, lists, changes and removes appliances', async () => {
    const id = await newVehicle()
    const a = ApplianceRecordSchema.parse(
      (await as('post', `/api/vehicles/${id}/appliances`, fridge).expect(201)).body,
    )
    expect(a).toMatchObject({ ...fridge, vehicleId: id, version: 1 })
    await as('post', `/api/vehicles/${id}/appliances`, laptop).expect(201)
    const list = await as('get', `/api/vehicles/${id}/appliances`).expect(200)
    expect(list.body.items.map((i: { name: string }) => i.name)).toEqual(['Compressor fridge', 'Laptop'])

    const patched = await as('patch', `/api/vehicles/${id}/appliances/${a.id}`, {
      version: 1,
      powerW: 50,
    }).expect(200)
    expect(patched.body).toMatchObject({ powerW: 50, hoursPerDay: 24, version: 2 })

    await as('delete', `/api/vehicles/${id}/appliances/${a.id}?version=2`).expect(204)
    const after = await as('get', `/api/vehicles/${id}/appliances`).expect(200)
    expect(after.body.items).toHaveLength(1)
    await as('patch', `/api/vehicles/${id}/appliances/${a.id}`, { version: 2, powerW: 1 }).expect(404)
  })

  it('names invalid fields, including a patch that breaks the merged row', async () => {
    const id = await newVehicle()
    const res = await as('post', `/api/vehicles/${id}/appliances`, {
      ...fridge,
      powerW: -5,
      supply: 'mains',
      wattage: 3,
    }).expect(400)
    expect(res.body.error.fields).toMatchObject({
      powerW: ['must be 0 or more'],
      supply: ['must be dc or ac'],
    })
    expect(res.body.error.fields.wattage).toEqual(['is not a known field'])

    const a = (await as('post', `/api/vehicles/${id}/appliances`, laptop).expect(201)).body
    // 17–22 is a 5 h window: 8 h cannot fit
    const bad = await as('patch', `/api/vehicles/${id}/appliances/${a.id}`, {
      version: 1,
      hoursPerDay: 8,
    }).expect(400)
    expect(bad.body.error.fields.hoursPerDay[0]).toMatch(/does not fit in the window 17–22/)
    const still = await as('get', `/api/vehicles/${id}/appliances`).expect(200)
    expect(still.body.items[0]).toMatchObject({ hoursPerDay: 3, version: 1 })
  })

  it('refuses a stale update with 409 and the current row, and leaves the row as it was', async () => {
    const id = await newVehicle()
    const a = (await as('post', `/api/vehicles/${id}/appliances`, fridge).expect(201)).body
    await call(ines)('patch', `/api/vehicles/${id}/appliances/${a.id}`, {
      version: 1,
      name: 'Fridge (Ines)',
    }).expect(200)
    const stale = await as('patch', `/api/vehicles/${id}/appliances/${a.id}`, {
      version: 1,
      powerW: 999,
    }).expect(409)
    expect(stale.body.error).toMatchObject({
      code: 'conflict',
      current: { id: a.id, name: 'Fridge (Ines)', powerW: 45, version: 2 },
    })
    const now = (await as('get', `/api/vehicles/${id}/appliances`).expect(200)).body.items[0]
    expect(now).toMatchObject({ name: 'Fridge (Ines)', powerW: 45, version: 2 })
    await as('delete', `/api/vehicles/${id}/appliances/${a.id}?version=1`).expect(409)
    await as('get', `/api/vehicles/${id}/appliances`)
      .expect(200)
      .expect((r) => expect(r.body.items).toHaveLength(1))
  })
})

describe('simultaneous edits', () => {
  it('lets exactly one of two updates carrying the same version win; the other gets 409', async () => {
    const id = await newVehicle()
    const a = (await as('post', `/api/vehicles/${id}/appliances`, fridge).expect(201)).body
    const tomasEditor = await createUser(ctx)
    await addMember(ctx, id, tomasEditor.id, 'editor')
    const results = await Promise.all([
      as('patch', `/api/vehicles/${id}/appliances/${a.id}`, { version: 1, powerW: 41 }),
      call(tomasEditor)('patch', `/api/vehicles/${id}/appliances/${a.id}`, { version: 1, powerW: 42 }),
    ])
    expect(results.map((r) => r.status).sort()).toEqual([200, 409])
    const winner = results.find((r) => r.status === 200)!.body
    const loser = results.find((r) => r.status === 409)!.body
    expect(loser.error.current).toMatchObject({ powerW: winner.powerW, version: 2 })
    const now = (await as('get', `/api/vehicles/${id}/appliances`).expect(200)).body.items[0]
    expect(now).toMatchObject({ powerW: winner.powerW, version: 2 })
  })
})

describe('charge sources', () => {
  it('adds each kind, changes and removes them', async () => {
    const id = await newVehicle()
    const s = ChargeSourceRecordSchema.parse(
      (await as('post', `/api/vehicles/${id}/sources`, solar).expect(201)).body,
    )
    expect(s).toMatchObject({ ...solar, version: 1 })
    await as('post', `/api/vehicles/${id}/sources`, { kind: 'dcdc', name: 'DC-DC', currentA: 30 }).expect(201)
    await as('post', `/api/vehicles/${id}/sources`, { kind: 'shore', name: 'Mains', currentA: 20 }).expect(
      201,
    )
    await as('post', `/api/vehicles/${id}/sources`, {
      kind: 'generator',
      name: 'Gen',
      currentA: 40,
      fuelLPerH: 0.5,
    }).expect(201)
    const list = await as('get', `/api/vehicles/${id}/sources`).expect(200)
    expect(list.body.items.map((i: { kind: string }) => i.kind)).toEqual([
      'solar',
      'dcdc',
      'shore',
      'generator',
    ])

    const patched = await as('patch', `/api/vehicles/${id}/sources/${s.id}`, {
      version: 1,
      peakPowerWp: 600,
    }).expect(200)
    expect(patched.body).toMatchObject({ kind: 'solar', peakPowerWp: 600, maxCurrentA: 30, version: 2 })
    await as('delete', `/api/vehicles/${id}/sources/${s.id}?version=2`).expect(204)
    expect((await as('get', `/api/vehicles/${id}/sources`).expect(200)).body.items).toHaveLength(3)
  })

  it('names wrong fields, refuses a kind change and a stale version', async () => {
    const id = await newVehicle()
    const bad = await as('post', `/api/vehicles/${id}/sources`, { kind: 'wind', name: 'x' }).expect(400)
    expect(bad.body.error.fields.kind).toEqual(['kind must be one of solar, dcdc, shore, generator'])
    const bad2 = await as('post', `/api/vehicles/${id}/sources`, { ...solar, tiltDeg: 120 }).expect(400)
    expect(bad2.body.error.fields.tiltDeg).toEqual(['must be between 0 and 90'])

    const s = (await as('post', `/api/vehicles/${id}/sources`, solar).expect(201)).body
    const kind = await as('patch', `/api/vehicles/${id}/sources/${s.id}`, {
      version: 1,
      kind: 'dcdc',
    }).expect(400)
    expect(Object.keys(kind.body.error.fields)).toEqual(['kind'])
    const unknown = await as('patch', `/api/vehicles/${id}/sources/${s.id}`, {
      version: 1,
      currentA: 10,
    }).expect(400)
    expect(unknown.body.error.fields).toEqual({ currentA: ['is not a known field'] })
    await as('patch', `/api/vehicles/${id}/sources/${s.id}`, { version: 1, name: 'Roof' }).expect(200)
    const stale = await as('patch', `/api/vehicles/${id}/sources/${s.id}`, {
      version: 1,
      peakPowerWp: 1,
    }).expect(409)
    expect(stale.body.error.current).toMatchObject({ name: 'Roof', peakPowerWp: 400, version: 2 })
  })
})

describe('history', () => {
  it('records who changed what, newest first, paginated', async () => {
    const id = await newVehicle('History van')
    await call(ines)('put', `/api/vehicles/${id}/battery`, { version: 0, battery: lfpBattery }).expect(200)
    const a = (await as('post', `/api/vehicles/${id}/appliances`, fridge).expect(201)).body
    await as('patch', `/api/vehicles/${id}/appliances/${a.id}`, {
      version: 1,
      powerW: 40,
      hoursPerDay: 20,
    }).expect(200)
    // a refused (stale) change leaves no trace
    await as('patch', `/api/vehicles/${id}/appliances/${a.id}`, { version: 1, powerW: 1 }).expect(409)

    const h = HistoryListSchema.parse((await as('get', `/api/vehicles/${id}/history`).expect(200)).body)
    expect(h.total).toBe(4)
    expect(h.items.map((e) => `${e.entity}:${e.action}`)).toEqual([
      'appliance:update',
      'appliance:create',
      'battery:create',
      'vehicle:create',
    ])
    expect(h.items[0]).toMatchObject({
      changedFields: ['hoursPerDay', 'powerW'],
      version: 2,
      actor: { id: ines.id },
    })
    expect(h.items[0]!.summary).toContain('Compressor fridge')
    const page = HistoryListSchema.parse(
      (await as('get', `/api/vehicles/${id}/history?limit=1&offset=1`).expect(200)).body,
    )
    expect(page.items.map((e) => e.action)).toEqual(['create'])
    await call(tomas)('get', `/api/vehicles/${id}/history`).expect(404)
  })
})

describe('appliance library', () => {
  it('serves typical appliances marked as common practice', async () => {
    const res = await as('get', '/api/appliance-library').expect(200)
    expect(res.body.source).toMatch(/common practice, no source/)
    expect(res.body.items.length).toBeGreaterThan(20)
    const keys = res.body.items.map((i: { key: string }) => i.key)
    expect(new Set(keys).size).toBe(keys.length)
    // every item can be added to a vehicle as it is
    const id = await newVehicle()
    const { key: _key, note: _note, ...first } = res.body.items[0]
    await as('post', `/api/vehicles/${id}/appliances`, first).expect(201)
  })
})
