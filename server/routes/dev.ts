import { Router } from 'express'
import type { AppContext } from '../context'
import { mailboxRouter } from '../services/mailbox-dev'

/**
 * Development-only helpers (not mounted when NODE_ENV=production), e.g. the fake mailbox.
 * One line per helper.
 */
export function devRouter(ctx: AppContext): Router {
  void ctx
  const r = Router()
  r.use('/mailbox', mailboxRouter(ctx))
  return r
}
