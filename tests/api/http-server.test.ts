import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import express from 'express'
import type { AddressInfo } from 'node:net'
import type { Server } from 'node:http'
import { createHttpServer } from '../../server/http-server'

// server/http-server.ts gives Node's request/response classes Express's methods, so Express's per-request
// Object.setPrototypeOf becomes a no-op. Express must behave exactly as with app.listen().
describe('createHttpServer', () => {
  const app = express()
  const seen: { sameRequestProto?: boolean; sameResponseProto?: boolean } = {}
  app.use(express.json())
  app.get('/hello/:name', (req, res) => {
    seen.sameRequestProto = Object.getPrototypeOf(req) === app.request
    seen.sameResponseProto = Object.getPrototypeOf(res) === app.response
    res.status(201).json({
      name: req.params.name,
      q: req.query.q,
      accept: req.get('accept'),
      json: req.is('json'),
      hasApp: req.app === app,
    })
  })
  app.post('/echo', (req, res) => res.send(req.body))
  app.get('/redirect', (_req, res) => res.redirect(302, '/hello/there'))
  let server: Server
  let base = ''
  beforeAll(async () => {
    server = createHttpServer(app)
    await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok))
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  })
  afterAll(() => new Promise<void>((ok) => server.close(() => ok())))

  it("answers with Express's request and response methods, on objects already of Express's prototypes", async () => {
    const res = await fetch(`${base}/hello/ines?q=1`, { headers: { accept: 'application/json' } })
    expect(res.status).toBe(201)
    expect(res.headers.get('content-type')).toMatch(/^application\/json/)
    expect(await res.json()).toEqual({
      name: 'ines',
      q: '1',
      accept: 'application/json',
      json: null,
      hasApp: true,
    })
    expect(seen).toEqual({ sameRequestProto: true, sameResponseProto: true })
  })

  it('parses bodies and redirects as usual', async () => {
    const echo = await fetch(`${base}/echo`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ a: [1, 2] }),
    })
    expect(await echo.json()).toEqual({ a: [1, 2] })
    const r = await fetch(`${base}/redirect`, { redirect: 'manual' })
    expect(r.status).toBe(302)
    expect(r.headers.get('location')).toBe('/hello/there')
  })
})
