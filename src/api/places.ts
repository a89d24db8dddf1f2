/** City search and time-zone lookup (docs/api.md), parsed with the shared contract. */
import { PlaceListSchema, TimeZoneAnswerSchema } from '@shared/schemas/vehicles'
import { http } from './http'

export const placesApi = {
  search: (q: string, signal?: AbortSignal, limit = 8) =>
    http
      .get(`/places?q=${encodeURIComponent(q)}&limit=${limit}`, signal)
      .then((b) => PlaceListSchema.parse(b).items),
  timeZone: (latitudeDeg: number, longitudeDeg: number, signal?: AbortSignal) =>
    http
      .get(`/places/timezone?latitudeDeg=${latitudeDeg}&longitudeDeg=${longitudeDeg}`, signal)
      .then((b) => TimeZoneAnswerSchema.parse(b).timeZone),
}
