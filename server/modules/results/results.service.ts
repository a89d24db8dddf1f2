/**
 * Stored scenario results: the shared engine's full analysis (simulate + autonomy + pack and solar searches
 * + classic sizing + chemistry comparison) of the plan built from the database, in its JSON form — the same
 * function and the same JSON conversion the browser's worker runs, so both give identical results.
 *
 * Results depend only on the plan, so they are memoised by a hash of the plan's JSON (a small LRU):
 * opening an Outlook, a Side by side page and the API bench hit the same few plans again and again, and an
 * edit to the vehicle or scenario changes the plan and so the key. A second memo maps a scenario and the revision
 * of the rows its plan is made of (a hash of their xmin, which PostgreSQL computes: server/modules/scenarios/
 * plan.ts) to the answer, so a repeated request skips reading, assembling, validating and hashing the plan.
 */
import { createHash } from 'node:crypto'
import { gzipSync } from 'node:zlib'
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

/** The body of GET /api/scenarios/:scenarioId/results (docs/api.md). */
export function resultsBody(scenarioId: string, computedInMs: number, cached: boolean, text: string): string {
  return `{"scenarioId":${JSON.stringify(scenarioId)},"computedInMs":${Math.round(computedInMs)},"cached":${cached},"results":${text}}`
}

/** A results answer for one scenario, ready to send as it is or gzip-compressed. */
export interface ResultsAnswer {
  /** The plan's hash (the ETag). */
  key: string
  cached: boolean
  body: string
  /** The body, gzip-compressed; a memoised answer compresses once and keeps it. */
  gzipped(): Buffer
}

interface MemoEntry {
  key: string
  body: string
  gzip: Buffer | null
}
/** Results answers by scenario and plan revision (server/modules/scenarios/plan.ts). */
const byDigest = new Map<string, MemoEntry>()

/**
 * The results of a scenario whose plan rows have this revision (`digest`): from the memo when this scenario's plan was
 * seen as it is now, else through `loadPlan` (which throws for an incomplete plan; nothing is memoised then)
 * and `resultsForPlan`. The memoised answer keeps its body text and, once asked for, its gzip form, so a
 * repeated request neither reads, assembles, validates, hashes or serialises the plan and results, nor
 * compresses them again.
 */
export async function resultsForDigest(
  scenarioId: string,
  digest: string,
  loadPlan: () => Promise<{ plan: Plan; digest: string }>,
): Promise<ResultsAnswer> {
  const hit = byDigest.get(`${scenarioId}:${digest}`)
  if (hit) {
    const memoKey = `${scenarioId}:${digest}`
    byDigest.delete(memoKey)
    byDigest.set(memoKey, hit)
    return {
      key: hit.key,
      cached: true,
      body: hit.body,
      gzipped: () => (hit.gzip ??= gzipSync(hit.body)),
    }
  }
  // The plan may have changed since the digest was read: memoise under the digest of what was computed.
  const { plan, digest: current } = await loadPlan()
  const out = resultsForPlan(plan)
  if (byDigest.size >= CACHE_MAX) byDigest.delete(byDigest.keys().next().value as string)
  byDigest.set(`${scenarioId}:${current}`, {
    key: out.key,
    body: resultsBody(scenarioId, 0, true, out.text),
    gzip: null,
  })
  const body = resultsBody(scenarioId, out.computedInMs, out.cached, out.text)
  return { key: out.key, cached: out.cached, body, gzipped: () => gzipSync(body) }
}

/** For tests: forget memoised results. */
export function clearResultsCache(): void {
  cache.clear()
  byDigest.clear()
}
