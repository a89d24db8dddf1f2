/**
 * Plain-JSON form of results: typed arrays become number arrays, so a result computed in the browser and one
 * computed on the server can be compared for identity (JSON.stringify of both) and stored.
 */

export type Jsonified<T> = T extends Float64Array | Float32Array | Uint8Array
  ? number[]
  : T extends (infer U)[]
    ? Jsonified<U>[]
    : T extends object
      ? { [K in keyof T]: Jsonified<T[K]> }
      : T

function convert(value: unknown): unknown {
  if (ArrayBuffer.isView(value) && !(value instanceof DataView))
    return Array.from(value as unknown as ArrayLike<number>)
  if (Array.isArray(value)) return value.map(convert)
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {}
    for (const [k, v] of Object.entries(value)) out[k] = convert(v)
    return out
  }
  if (typeof value === 'number' && !Number.isFinite(value)) return null
  return value
}

/** Convert simulate()/analysePlan() output (or any part of it) to plain JSON-safe data. */
export function resultsToJson<T>(result: T): Jsonified<T> {
  return convert(result) as Jsonified<T>
}
