/** Reviews: requests, the thread, payment and the advisor's steps (docs/reviews.md). */
import {
  CheckoutSchema,
  CommentSchema,
  ReviewDetailSchema,
  ReviewListSchema,
  type CommentCreate,
  type ReviewAnswer,
  type ReviewCreate,
} from '@shared/schemas/reviews'
import { http } from './http'

const r = (id: string) => `/reviews/${encodeURIComponent(id)}`
const detail = (b: unknown) => ReviewDetailSchema.parse(b)

export const reviewsApi = {
  list: () => http.get('/reviews').then((b) => ReviewListSchema.parse(b)),
  get: (id: string) => http.get(r(id)).then(detail),
  create: (input: ReviewCreate) => http.post('/reviews', input).then(detail),
  checkout: (id: string) => http.post(`${r(id)}/checkout`).then((b) => CheckoutSchema.parse(b)),
  comment: (id: string, input: CommentCreate) =>
    http.post(`${r(id)}/comments`, input).then((b) => CommentSchema.parse(b)),
  answer: (id: string, input: ReviewAnswer) => http.post(`${r(id)}/answer`, input).then(detail),
  step: (id: string, step: 'start' | 'close' | 'cancel' | 'decline') =>
    http.post(`${r(id)}/${step}`).then(detail),
}
