import type { ZodType, z } from 'zod'
import { validationFailed, type FieldErrors } from '../../errors'

/**
 * Like server/validate.ts `parse()`, but an unknown field is named by its own path
 * (`{ wattage: ['is not a known field'] }`), as the engine's parsePlan does, instead of under `_`.
 */
export function parseInput<S extends ZodType>(schema: S, input: unknown): z.infer<S> {
  const r = schema.safeParse(input)
  if (r.success) return r.data
  const fields: FieldErrors = {}
  const add = (path: readonly PropertyKey[], message: string) => {
    const key = path.length ? path.map(String).join('.') : '_'
    ;(fields[key] ??= []).push(message)
  }
  for (const issue of r.error.issues) {
    if (issue.code === 'unrecognized_keys')
      for (const k of issue.keys) add([...issue.path, k], 'is not a known field')
    else add(issue.path, issue.message)
  }
  throw validationFailed(fields)
}
