import { ApiErrorBodySchema } from '@shared/schemas/error'

/** An API failure with the server's machine code, message and per-field messages. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string[]> = {},
    readonly body: unknown = null,
  ) {
    super(message)
  }
  /** First message for a field path such as `battery.capacityAh`, for Quasar's `error-message`. */
  field(path: string): string | undefined {
    return this.fields[path]?.[0]
  }
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'

/** Hook the auth store sets so a 401 anywhere sends the user to sign in. */
let onUnauthorized: (() => void) | null = null
export function setUnauthorizedHandler(fn: (() => void) | null): void {
  onUnauthorized = fn
}

/** The one fetch wrapper: JSON in and out, cookies included, errors as ApiError. */
export async function api<T = unknown>(
  method: Method,
  path: string,
  body?: unknown,
  signal?: AbortSignal,
): Promise<T> {
  if (method !== 'GET' && typeof navigator !== 'undefined' && navigator.onLine === false) {
    // Offline rule: edits are refused clearly, never queued silently; the form keeps what was typed.
    throw new ApiError(
      0,
      'offline',
      'You are offline, so this change was not saved. It is still in the form: save again once you have a signal.',
    )
  }
  let res: Response
  try {
    res = await fetch(path.startsWith('/api') ? path : `/api${path}`, {
      method,
      credentials: 'same-origin',
      headers:
        body === undefined
          ? { accept: 'application/json' }
          : { 'content-type': 'application/json', accept: 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal,
    })
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err
    throw new ApiError(
      0,
      'offline',
      typeof navigator !== 'undefined' && navigator.onLine === false
        ? 'You are offline, and this is not kept on this device yet (open it once with a signal to have it offline). Nothing was changed.'
        : 'Could not reach Ohmward. Check your connection and try again.',
    )
  }
  if (res.status === 204) return undefined as T
  const text = await res.text()
  let json: unknown
  try {
    json = text ? JSON.parse(text) : null
  } catch {
    json = null
  }
  if (!res.ok) {
    const parsed = ApiErrorBodySchema.safeParse(json)
    if (res.status === 401 && onUnauthorized) onUnauthorized()
    if (parsed.success) {
      const e = parsed.data.error
      throw new ApiError(res.status, e.code, e.message, e.fields ?? {}, json)
    }
    throw new ApiError(res.status, 'http_' + res.status, `The server answered ${res.status}.`)
  }
  return json as T
}

export const http = {
  get: <T>(path: string, signal?: AbortSignal) => api<T>('GET', path, undefined, signal),
  post: <T>(path: string, body?: unknown) => api<T>('POST', path, body ?? {}),
  put: <T>(path: string, body?: unknown) => api<T>('PUT', path, body ?? {}),
  patch: <T>(path: string, body?: unknown) => api<T>('PATCH', path, body ?? {}),
  del: <T>(path: string) => api<T>('DELETE', path),
}
