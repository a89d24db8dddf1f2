import { reactive } from 'vue'
import { ApiError } from '../../api/http'

/**
 * Server field messages for a form: `errors.email` is the first message for that field. `take(e)` fills
 * them from an ApiError and returns the general message to show above the form.
 */
export function useFormErrors<K extends string>(fields: readonly K[]) {
  const errors = reactive(Object.fromEntries(fields.map((f) => [f, '']))) as Record<K, string>
  function clear() {
    for (const f of fields) errors[f] = ''
  }
  function take(e: unknown): string {
    clear()
    if (!(e instanceof ApiError)) return 'Something went wrong. Please try again.'
    let placed = false
    for (const f of fields) {
      const m = e.field(f)
      if (m) {
        errors[f] = m
        placed = true
      }
    }
    return placed && e.code === 'validation_failed' ? '' : e.message
  }
  return { errors, clear, take }
}
