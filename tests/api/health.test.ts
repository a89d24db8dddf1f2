import { describe, it, expect, afterAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { freePort } from '../../scripts/lib/pg'

describe('GET /api/health', () => {
  const ctx = testContext()
  const app = createApp(ctx)
  afterAll(() => ctx.pool.end())

  it('reports the version and a database that answers', async () => {
    const res = await request(app).get('/api/health').expect(200)
    expect(res.body).toMatchObject({ status: 'ok', database: 'up' })
    expect(res.body.version).toMatch(/^\d+\.\d+\.\d+/)
    expect(res.headers['x-content-type-options']).toBe('nosniff') // helmet
  })

  it('answers 503 when the pool cannot connect', async () => {
    const port = await freePort() // nothing listens there
    const down = testContext({ DATABASE_URL: `postgres://postgres@127.0.0.1:${port}/ohmward_test` })
    const res = await request(createApp(down)).get('/api/health').expect(503)
    expect(res.body).toMatchObject({ status: 'degraded', database: 'down' })
    await down.pool.end()
  })

  it('answers unknown API routes with the JSON error shape', async () => {
    const res = await request(app).get('/api/no-such-thing').expect(404)
    expect(res.body).toEqual({ error: { code: 'not_found', message: 'That API route was not found.' } })
  })

  it('answers malformed JSON with a 400 in the error shape', async () => {
    const res = await request(app)
      .post('/api/health')
      .set('content-type', 'application/json')
      .send('{"broken":')
      .expect(400)
    expect(res.body.error.code).toBe('bad_json')
  })

  it('refuses a cross-origin state-changing request', async () => {
    const res = await request(app)
      .post('/api/health')
      .set('origin', 'https://evil.example')
      .send({})
      .expect(403)
    expect(res.body.error.code).toBe('forbidden')
  })
})
