import { Router, type Request } from 'express'
import type { AppContext } from '../../context'
import { parse } from '../../validate'
import { currentUser, requireUser } from '../../middleware/require-user'
import { CommentCreateSchema, ReviewAnswerSchema, ReviewCreateSchema } from '../../../shared/schemas/reviews'
import * as svc from './service'

const id = (req: Request) => String(req.params.reviewId ?? '')

/** /api/reviews: requests, the thread, payment, the advisor's steps, the inbox. */
export function reviewsRouter(ctx: AppContext): Router {
  const r = Router()
  r.use(requireUser)

  r.get('/', async (_req, res) => {
    res.json({ items: await svc.listReviews(ctx, currentUser(res).id) })
  })
  r.post('/', async (req, res) => {
    const body = parse(ReviewCreateSchema, req.body)
    res.status(201).json(await svc.createReview(ctx, res, body))
  })
  r.get('/:reviewId', async (req, res) => {
    res.json(await svc.getReview(ctx, id(req), currentUser(res).id))
  })
  r.post('/:reviewId/checkout', async (req, res) => {
    res.json(await svc.startCheckout(ctx, id(req), currentUser(res).id))
  })
  r.post('/:reviewId/comments', async (req, res) => {
    const body = parse(CommentCreateSchema, req.body)
    res.status(201).json(await svc.addComment(ctx, id(req), currentUser(res).id, body))
  })
  const step = (path: string, fn: (ctx: AppContext, reviewId: string, userId: string) => Promise<void>) =>
    r.post(`/:reviewId/${path}`, async (req, res) => {
      const userId = currentUser(res).id
      await fn(ctx, id(req), userId)
      res.json(await svc.getReview(ctx, id(req), userId))
    })
  step('start', svc.startReview)
  step('close', svc.closeReview)
  step('cancel', svc.cancelReview)
  step('decline', svc.declineReview)
  r.post('/:reviewId/answer', async (req, res) => {
    const body = parse(ReviewAnswerSchema, req.body)
    const userId = currentUser(res).id
    await svc.answerReview(ctx, id(req), userId, body)
    res.json(await svc.getReview(ctx, id(req), userId))
  })
  return r
}
