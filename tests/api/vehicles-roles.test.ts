/**
 * Authorization by membership: owner and editor write; viewer and advisor read; deleting a vehicle is
 * owner only; non-members get 404 for everything under the vehicle (no existence leak).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import type { VehicleRole } from '../../shared/schemas/vehicles'
import {
  addMember,
  caller,
  fridge,
  lfpBattery,
  solar,
  vehicleInput,
  winterTrip,
  type Method,
} from './vehicles.fixtures'

const ctx = testContext()
const app = createApp(ctx)
const call = caller(app)
afterAll(() => ctx.pool.end())

type Who = VehicleRole | 'stranger'
const people = {} as Record<Who, TestUser>
let vehicleId: string
let applianceId: string
let sourceId: string
let scenarioId: string

beforeAll(async () => {
  for (const who of ['owner', 'editor', 'viewer', 'advisor', 'stranger'] as const)
    people[who] = await createUser(ctx)
  const owner = call(people.owner)
  vehicleId = (await owner('post', '/api/vehicles', vehicleInput).expect(201)).body.id
  for (const role of ['editor', 'viewer', 'advisor'] as const)
    await addMember(ctx, vehicleId, people[role].id, role)
  await owner('put', `/api/vehicles/${vehicleId}/battery`, { version: 0, battery: lfpBattery }).expect(200)
  applianceId = (await owner('post', `/api/vehicles/${vehicleId}/appliances`, fridge).expect(201)).body.id
  sourceId = (await owner('post', `/api/vehicles/${vehicleId}/sources`, solar).expect(201)).body.id
  scenarioId = (
    await owner('post', `/api/vehicles/${vehicleId}/scenarios`, { name: 'Winter', trip: winterTrip }).expect(
      201,
    )
  ).body.id
})

const v = () => `/api/vehicles/${vehicleId}`
const READS: [string, () => string][] = [
  ['vehicle', () => v()],
  ['battery', () => `${v()}/battery`],
  ['inverter', () => `${v()}/inverter`],
  ['appliances', () => `${v()}/appliances`],
  ['appliances.csv', () => `${v()}/appliances.csv`],
  ['sources', () => `${v()}/sources`],
  ['history', () => `${v()}/history`],
  ['vehicle scenarios', () => `${v()}/scenarios`],
  ['scenario', () => `/api/scenarios/${scenarioId}`],
  ['scenario plan', () => `/api/scenarios/${scenarioId}/plan`],
]

/** Writes that change nothing lasting when allowed (same values, or a preview), with their success status. */
const WRITES: [string, Method, () => string, () => unknown, number][] = [
  ['add appliance', 'post', () => `${v()}/appliances`, () => ({ ...fridge, name: 'Second fridge' }), 201],
  ['add source', 'post', () => `${v()}/sources`, () => ({ kind: 'shore', name: 'Mains', currentA: 10 }), 201],
  [
    'import preview',
    'post',
    () => `${v()}/appliances/import`,
    () => ({ csv: 'name\n', confirm: false }),
    200,
  ],
  ['add scenario', 'post', () => `${v()}/scenarios`, () => ({ name: 'Another', trip: winterTrip }), 201],
  [
    'duplicate scenario',
    'post',
    () => `/api/scenarios/${scenarioId}/duplicate`,
    () => ({ name: 'Copy' }),
    201,
  ],
]

describe.each(['owner', 'editor', 'viewer', 'advisor'] as const)('%s', (role) => {
  const canWrite = role === 'owner' || role === 'editor'

  it.each(READS)('reads the %s', async (_what, path) => {
    await call(people[role])('get', path()).expect(200)
  })

  it.each(WRITES)(`${canWrite ? 'may' : 'may not'} %s`, async (_what, method, path, body, okStatus) => {
    const res = await call(people[role])(method, path(), body())
    expect(res.status).toBe(canWrite ? okStatus : 403)
    if (!canWrite) expect(res.body.error.code).toBe('forbidden')
  })

  it(`${canWrite ? 'may' : 'may not'} change the vehicle, its equipment and a scenario`, async () => {
    const as = call(people[role])
    const expected = canWrite ? 200 : 403
    const vehicle = (await as('get', v())).body
    expect((await as('patch', v(), { version: vehicle.version, notes: role })).status).toBe(expected)
    const battery = (await as('get', `${v()}/battery`)).body
    expect(
      (await as('put', `${v()}/battery`, { version: battery.version, battery: lfpBattery })).status,
    ).toBe(expected)
    const appliance = (await as('get', `${v()}/appliances`)).body.items.find(
      (a: { id: string }) => a.id === applianceId,
    )
    expect(
      (await as('patch', `${v()}/appliances/${applianceId}`, { version: appliance.version, powerW: 45 }))
        .status,
    ).toBe(expected)
    const source = (await as('get', `${v()}/sources`)).body.items.find(
      (s: { id: string }) => s.id === sourceId,
    )
    expect(
      (await as('patch', `${v()}/sources/${sourceId}`, { version: source.version, name: 'Roof panels' }))
        .status,
    ).toBe(expected)
    const scenario = (await as('get', `/api/scenarios/${scenarioId}`)).body
    expect(
      (await as('patch', `/api/scenarios/${scenarioId}`, { version: scenario.version, notes: role })).status,
    ).toBe(expected)
  })

  // The owner's delete runs last, in 'the owner' below, after every other role was refused.
  if (role !== 'owner') {
    it('may not delete the vehicle (owner only)', async () => {
      const vehicle = (await call(people[role])('get', v())).body
      const res = await call(people[role])('delete', `${v()}?version=${vehicle.version}`).expect(403)
      expect(res.body.error.message).toMatch(/owner/)
      await call(people.owner)('get', v()).expect(200)
    })
  }

  it(`${canWrite ? 'may' : 'may not'} delete an appliance, a source and a scenario`, async () => {
    const owner = call(people.owner)
    const a = (await owner('post', `${v()}/appliances`, { ...fridge, name: `Gone ${role}` }).expect(201)).body
    const s = (await owner('post', `${v()}/sources`, { kind: 'dcdc', name: 'x', currentA: 5 }).expect(201))
      .body
    const sc = (await owner('post', `${v()}/scenarios`, { name: 'Gone', trip: winterTrip }).expect(201)).body
    const as = call(people[role])
    const expected = canWrite ? 204 : 403
    expect((await as('delete', `${v()}/appliances/${a.id}?version=1`)).status).toBe(expected)
    expect((await as('delete', `${v()}/sources/${s.id}?version=1`)).status).toBe(expected)
    expect((await as('delete', `/api/scenarios/${sc.id}?version=1`)).status).toBe(expected)
  })
})

describe('a copy shared with the crew of the vehicle it was copied from (crewFrom)', () => {
  const copyOf = { ...vehicleInput, name: 'Test van (tried 330 Ah)', crewFrom: '' }
  const roleOn = async (copyId: string, who: Who) => {
    const res = await call(people[who])('get', `/api/vehicles/${copyId}`)
    return res.status === 200 ? (res.body.myRole as string) : res.status
  }

  it('made by the owner: editors stay editors, viewers viewers; advisors and outsiders do not see it', async () => {
    const res = await call(people.owner)('post', '/api/vehicles', { ...copyOf, crewFrom: vehicleId }).expect(
      201,
    )
    const copyId = res.body.id as string
    expect(await roleOn(copyId, 'owner')).toBe('owner')
    expect(await roleOn(copyId, 'editor')).toBe('editor')
    expect(await roleOn(copyId, 'viewer')).toBe('viewer')
    expect(await roleOn(copyId, 'advisor')).toBe(404)
    expect(await roleOn(copyId, 'stranger')).toBe(404)
    await call(people.viewer)('patch', `/api/vehicles/${copyId}`, { version: 1, name: 'x' }).expect(403)
    await call(people.editor)('put', `/api/vehicles/${copyId}/battery`, {
      version: 0,
      battery: lfpBattery,
    }).expect(200)
  })

  it('made by an editor: the editor owns the copy and the original owner edits it', async () => {
    const res = await call(people.editor)('post', '/api/vehicles', { ...copyOf, crewFrom: vehicleId }).expect(
      201,
    )
    const copyId = res.body.id as string
    expect(await roleOn(copyId, 'editor')).toBe('owner')
    expect(await roleOn(copyId, 'owner')).toBe('editor')
    expect(await roleOn(copyId, 'viewer')).toBe('viewer')
  })

  it.each(['viewer', 'advisor', 'stranger'] as const)(
    'is refused to a %s of the original, naming the field, and nothing is created',
    async (who) => {
      const as = call(people[who])
      const before = (await as('get', '/api/vehicles').expect(200)).body.total
      const res = await as('post', '/api/vehicles', { ...copyOf, crewFrom: vehicleId }).expect(400)
      expect(res.body.error.fields.crewFrom[0]).toMatch(/vehicle you can change/)
      expect((await as('get', '/api/vehicles').expect(200)).body.total).toBe(before)
    },
  )

  it('refuses a crewFrom that is not an id', async () => {
    const res = await call(people.owner)('post', '/api/vehicles', { ...copyOf, crewFrom: 'lingon' }).expect(
      400,
    )
    expect(res.body.error.fields.crewFrom[0]).toMatch(/UUID/)
  })
})

describe('a non-member', () => {
  it.each(READS)('gets 404 for the %s', async (_what, path) => {
    const res = await call(people.stranger)('get', path()).expect(404)
    expect(res.body.error.code).toBe('not_found')
  })

  it.each(WRITES)('gets 404 when trying to %s', async (_what, method, path, body) => {
    await call(people.stranger)(method, path(), body()).expect(404)
  })

  it('gets 404 for changes and deletes, and does not see the vehicle in lists', async () => {
    const as = call(people.stranger)
    await as('patch', v(), { version: 1, name: 'Mine now' }).expect(404)
    await as('delete', `${v()}?version=1`).expect(404)
    await as('put', `${v()}/battery`, { version: 1, battery: lfpBattery }).expect(404)
    await as('patch', `/api/scenarios/${scenarioId}`, { version: 1, name: 'x' }).expect(404)
    expect((await as('get', '/api/vehicles').expect(200)).body.total).toBe(0)
    expect((await as('get', '/api/scenarios').expect(200)).body.total).toBe(0)
  })
})

describe('the owner', () => {
  it('may delete the vehicle (after everyone else was refused)', async () => {
    const owner = call(people.owner)
    const vehicle = (await owner('get', v()).expect(200)).body
    await owner('delete', `${v()}?version=${vehicle.version}`).expect(204)
    await call(people.editor)('get', v()).expect(404)
    await owner('get', `/api/scenarios/${scenarioId}`).expect(404)
  })
})
