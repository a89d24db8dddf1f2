/** The advisor directory and an advisor's own profile (docs/reviews.md). */
import { AdvisorListSchema, AdvisorProfileSchema, type AdvisorProfilePut } from '@shared/schemas/reviews'
import { ApiError, http } from './http'

export const advisorsApi = {
  list: (q = '') =>
    http.get(`/advisors${q ? `?q=${encodeURIComponent(q)}` : ''}`).then((b) => AdvisorListSchema.parse(b)),
  get: (userId: string) =>
    http.get(`/advisors/${encodeURIComponent(userId)}`).then((b) => AdvisorProfileSchema.parse(b)),
  /** My profile, or null before I save one. */
  mine: () =>
    http
      .get('/advisors/me')
      .then((b) => AdvisorProfileSchema.parse(b))
      .catch((e: unknown) => {
        if (e instanceof ApiError && e.status === 404) return null
        throw e
      }),
  save: (input: AdvisorProfilePut) =>
    http.put('/advisors/me', input).then((b) => AdvisorProfileSchema.parse(b)),
}
