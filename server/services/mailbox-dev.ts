import { Router } from 'express'
import type { AppContext } from '../context'
import { serviceUnavailable } from '../errors'
import { sameOrigin } from '../middleware/same-origin'

/**
 * Development only (mounted under /dev): the messages the local fake SMTP server caught, as JSON, for the
 * Mailbox page. It relays to the fake's own HTTP API (OHMWARD_FAKE_MAIL_API).
 */
export function mailboxRouter(ctx: AppContext): Router {
  const r = Router()
  const relay = async (path: string, method: 'GET' | 'DELETE' = 'GET') => {
    const base = ctx.env.OHMWARD_FAKE_MAIL_API
    if (!base)
      throw serviceUnavailable('The local mailbox is not running (OHMWARD_FAKE_MAIL_API is not set).')
    let res: Response
    try {
      res = await fetch(base.replace(/\/$/, '') + path, { method })
    } catch {
      throw serviceUnavailable('The local mailbox is not answering.')
    }
    return { status: res.status, body: res.status === 204 ? null : await res.json() }
  }
  r.get('/messages', async (req, res) => {
    const q = typeof req.query.to === 'string' ? `?to=${encodeURIComponent(req.query.to)}` : ''
    const out = await relay('/messages' + q)
    res.status(out.status).json(out.body)
  })
  r.get('/messages/:id', async (req, res) => {
    const out = await relay(`/messages/${encodeURIComponent(String(req.params.id))}`)
    res.status(out.status).json(out.body)
  })
  r.delete('/messages', sameOrigin(ctx.env.APP_URL), async (_req, res) => {
    const out = await relay('/messages', 'DELETE')
    res.status(out.status).end()
  })
  return r
}
