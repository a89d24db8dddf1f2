import { useQuasar } from 'quasar'
import { ApiError } from '../api/http'
import ConflictDialog from '../components/common/ConflictDialog.vue'
import { changedOnly, conflictRows, rebase } from './conflictDiff'

export type ConflictChoice = 'reload' | 'reapply' | 'cancel'

interface RecordLike {
  version?: number
  updatedAt?: string | null
  updatedBy?: { displayName: string } | null
}

/** The record a 409 answer carries as `error.current` (null when it was deleted). */
export function conflictCurrent(err: ApiError): RecordLike | null {
  const body = err.body as { error?: { current?: unknown } } | null
  const current = body?.error?.current
  return current && typeof current === 'object' ? (current as RecordLike) : null
}

export function isConflict(err: unknown): err is ApiError {
  return err instanceof ApiError && err.status === 409
}

function whenText(iso: string | null | undefined): string {
  if (!iso) return 'just now'
  const d = new Date(iso)
  return `at ${d.toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' })}`
}

/**
 * Saves with optimistic concurrency. On 409 it shows what changed (your start, saved now, your edit)
 * and lets the user load the newer version or apply their edit again on top of it.
 */
export function useConflictDialog() {
  const $q = useQuasar()

  /** `current` is the part to compare; `meta` the stored record (who and when). Null = deleted. */
  function ask(
    what: string,
    base: unknown,
    mine: unknown,
    current: unknown,
    meta: RecordLike | null,
  ): Promise<ConflictChoice> {
    return new Promise((resolve) => {
      $q.dialog({
        component: ConflictDialog,
        componentProps: {
          what,
          who: meta?.updatedBy?.displayName ?? 'Someone',
          when: whenText(meta?.updatedAt),
          rows: meta ? conflictRows(base, mine, current) : [],
          deleted: meta === null,
        },
      })
        .onOk((choice: ConflictChoice) => resolve(choice))
        .onCancel(() => resolve('cancel'))
    })
  }

  /**
   * @param mine     the edit: a whole record (`whole: true`, e.g. the battery bank or a scenario's fields)
   *                 or a partial patch of top-level fields
   * @param attempt  sends `body` with the given version (the first time `body` is `mine`)
   * @param reload   loads the stored version into the screen
   * @param compare  picks the comparable part of a record (e.g. `r => r.battery`); default: the record
   * @returns true when the edit is saved; false when the user reloaded or kept editing
   *
   * On "apply my edit again" only what this editor changed is put on top of the stored version:
   * a whole record is rebased field by field, a patch keeps just its changed fields.
   */
  async function saveWithConflicts<R extends RecordLike, B>(opts: {
    what: string
    base: R
    mine: B
    version: number
    whole?: boolean
    attempt: (version: number, body: B) => Promise<unknown>
    reload: () => Promise<void>
    compare?: (record: R) => unknown
  }): Promise<boolean> {
    const pick = opts.compare ?? ((r: R) => r)
    let version = opts.version
    let body: B = opts.mine
    for (;;) {
      try {
        await opts.attempt(version, body)
        return true
      } catch (err) {
        if (!isConflict(err)) throw err
        const current = conflictCurrent(err) as R | null
        const base = pick(opts.base)
        const choice = await ask(opts.what, base, opts.mine, current ? pick(current) : null, current)
        if (choice === 'reapply' && current && typeof current.version === 'number') {
          version = current.version
          body = opts.whole
            ? rebase(base, opts.mine, pick(current))
            : opts.mine && typeof opts.mine === 'object'
              ? (changedOnly(base, opts.mine as Record<string, unknown>) as B)
              : opts.mine
          continue
        }
        if (choice === 'reload' || !current) await opts.reload()
        return false
      }
    }
  }

  return { ask, saveWithConflicts }
}
