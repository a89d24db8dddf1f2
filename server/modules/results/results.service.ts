/**
 * Stored scenario results: the shared engine's full analysis (simulate + autonomy + pack and solar searches
 * + classic sizing + chemistry comparison) of the plan built from the database, in its JSON form — the same
 * function and the same JSON conversion the browser's worker runs, so both give identical results.
 *
 * Results depend only on the plan, so they are memoised by a hash of the plan's JSON (a small LRU):
 * opening an Outlook, a Side by side page and the API bench hit the same few plans again and again, and an
 * edit to the vehicle or scenario changes the plan and so the key.
 */
import { createHash } from 'node:crypto'
import {
  analysePlan,
  resultsToJson,
  type Analysis,
  type Jsonified,
  type Plan,
} from '../../../shared/engine/index'

export type ResultsJson = Jsonified<Analysis>

const CACHE_MAX = 64
/** Each entry keeps the results and their JSON text, so a repeated request is not serialised again. */
const cache = new Map<string, { results: ResultsJson; text: string }>()

export function planKey(plan: Plan): string {
  return createHash('sha256').update(JSON.stringify(plan)).digest('hex')
}

/** The analysis of one plan, as JSON; `cached` says whether it came from the memo. */
export function resultsForPlan(plan: Plan): {
  results: ResultsJson
  /** `JSON.stringify(results)`, kept with the memo. */
  text: string
  key: string
  cached: boolean
  computedInMs: number
} {
  const key = planKey(plan)
  const hit = cache.get(key)
  if (hit) {
    cache.delete(key)
    cache.set(key, hit) // most recently used last
    return { ...hit, key, cached: true, computedInMs: 0 }
  }
  const started = performance.now()
  const results = resultsToJson(analysePlan(plan))
  const computedInMs = performance.now() - started
  const entry = { results, text: JSON.stringify(results) }
  if (cache.size >= CACHE_MAX) cache.delete(cache.keys().next().value as string)
  cache.set(key, entry)
  return { ...entry, key, cached: false, computedInMs }
}

/** For tests: forget memoised results. */
export function clearResultsCache(): void {
  cache.clear()
}
