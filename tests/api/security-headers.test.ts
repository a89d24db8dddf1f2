import { describe, expect, it } from 'vitest'
import express from 'express'
import helmet from 'helmet'
import request from 'supertest'
import { helmetOptions } from '../../server/app'
import { securityHeaders } from '../../server/middleware/security-headers'

/** The headers of one answer, without those that change per answer. */
async function headersOf(use: express.RequestHandler, path = '/x') {
  const app = express()
  app.use(use)
  app.get('/x', (_req, res) => res.json({ ok: true }))
  const res = await request(app).get(path)
  const { date: _date, etag: _etag, ...rest } = res.headers
  return rest
}

// server/middleware/security-headers.ts works helmet's headers out once; they must be exactly helmet's own.
describe('securityHeaders', () => {
  it.each([
    ['http', 'http://127.0.0.1:3000'],
    ['https (with HSTS)', 'https://ohmward.example'],
  ])('sets the same headers as helmet itself for an %s app URL', async (_what, url) => {
    const ours = await headersOf(securityHeaders(helmetOptions(url)))
    const theirs = await headersOf(helmet(helmetOptions(url)))
    expect(ours).toEqual(theirs)
    expect(ours['content-security-policy']).toContain("worker-src 'self' blob:")
    expect(ours['x-powered-by']).toBeUndefined()
    expect(Boolean(ours['strict-transport-security'])).toBe(url.startsWith('https:'))
  })
})
