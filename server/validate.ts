import type { ZodError, ZodType, z } from 'zod'
import { validationFailed, type FieldErrors } from './errors'

/** Zod issues as `{ "battery.capacityAh": ["must be at least 1"] }`. */
export function zodFieldErrors(err: ZodError): FieldErrors {
  const out: FieldErrors = {}
  for (const issue of err.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_'
    ;(out[key] ??= []).push(issue.message)
  }
  return out
}

/** Parse input at the edge or throw a 400 that names each field. */
export function parse<S extends ZodType>(schema: S, input: unknown): z.infer<S> {
  const r = schema.safeParse(input)
  if (!r.success) throw validationFailed(zodFieldErrors(r.error))
  return r.data
}
