import { Router } from 'express'
import type { AppContext } from '../../context'
import { parse } from '../../validate'
import { notFound } from '../../errors'
import { currentUser, requireUser } from '../../middleware/require-user'
import { AdvisorProfilePutSchema } from '../../../shared/schemas/reviews'
import * as advisors from './service'

/** /api/advisors: the directory (signed-in users) and an advisor's own profile. */
export function advisorsRouter(ctx: AppContext): Router {
  const r = Router()
  r.use(requireUser)

  r.get('/', async (req, res) => {
    const q = typeof req.query.q === 'string' ? req.query.q.trim().slice(0, 100) : undefined
    res.json({ items: await advisors.listAdvisors(ctx, q || undefined) })
  })

  r.get('/me', async (_req, res) => {
    const me = currentUser(res)
    const profile = await advisors.getMyProfile(ctx, me.id)
    if (!profile) throw notFound('Your advisor profile')
    res.json(profile)
  })

  r.put('/me', async (req, res) => {
    const me = currentUser(res)
    const body = parse(AdvisorProfilePutSchema, req.body)
    res.json(await advisors.putMyProfile(ctx, me, body))
  })

  r.get('/:userId', async (req, res) => {
    res.json(await advisors.getAdvisor(ctx, String(req.params.userId)))
  })

  return r
}
