import { Router } from 'express'
import { PlaceSearchQuerySchema, TimeZoneQuerySchema } from '../../../shared/schemas/vehicles'
import type { AppContext } from '../../context'
import { requireUser } from '../../middleware/require-user'
import { parseInput as parse } from '../vehicles/input'
import { searchPlaces, timeZoneAnswer } from './places.service'

/** /api/places: city search and time zone from coordinates. */
export function placesRouter(_ctx: AppContext): Router {
  const r = Router()
  r.use(requireUser)
  r.get('/', (req, res) => {
    const { q, limit } = parse(PlaceSearchQuerySchema, req.query)
    res.json({ items: searchPlaces(q, limit) })
  })
  r.get('/timezone', (req, res) => {
    const { latitudeDeg, longitudeDeg } = parse(TimeZoneQuerySchema, req.query)
    res.json(timeZoneAnswer(latitudeDeg, longitudeDeg))
  })
  return r
}
