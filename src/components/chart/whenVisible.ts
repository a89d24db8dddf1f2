/**
 * Work that only matters on screen: a chart or table that is scrolled out of view catches up in idle time
 * (or as soon as it comes near the viewport, or before printing), so a "Try a change" move pays only for
 * what can be seen. Visible parts update at once, in the same task as the move.
 */
import { onBeforeUnmount, onMounted, shallowRef, watch, type Ref, type ShallowRef } from 'vue'
import { cancelIdle, requestIdle } from '../../composables/idle'

/** How far outside the viewport a part still counts as visible, so it is current as it scrolls in. */
const MARGIN = '50px 0px'
/** A hidden part catches up once the controls have been still this long (not within a drag). [ms] */
const QUIET_MS = 200
/**
 * True between the browser's beforeprint and afterprint: everything follows at once (a part that gets new
 * input while printing, such as a chart inside a block that has just caught up, must not wait for idle time).
 */
let printing = false
if (typeof window !== 'undefined') {
  window.addEventListener('beforeprint', () => (printing = true))
  window.addEventListener('afterprint', () => (printing = false))
}

/** One observer for every part (the browser computes intersections once per frame for all of them). */
let observer: IntersectionObserver | null = null
const watched = new Map<Element, (visible: boolean) => void>()
function observe(el: Element, cb: (visible: boolean) => void): () => void {
  if (!observer)
    observer = new IntersectionObserver(
      (entries) => {
        for (const e of entries) watched.get(e.target)?.(e.isIntersecting)
      },
      { rootMargin: MARGIN },
    )
  watched.set(el, cb)
  observer.observe(el)
  return () => {
    watched.delete(el)
    observer?.unobserve(el)
  }
}

export interface VisibleWork {
  /**
   * Runs the work now when the element is (nearly) on screen; otherwise once the controls have been still
   * for a moment and the page is idle, or when it comes into view, whichever is first.
   */
  schedule(): void
  /** Runs pending work now. */
  flush(): void
}

/**
 * Runs `run` for the element `el`: at once while it is on screen (or before its visibility is known, or
 * where IntersectionObserver is missing), otherwise deferred. Pending work also runs before printing.
 */
export function useVisibleWork(el: Ref<HTMLElement | null>, run: () => void): VisibleWork {
  let visible = true
  let pending = false
  let idleId: number | null = null
  let quiet: ReturnType<typeof setTimeout> | null = null
  let unobserve: (() => void) | null = null

  function cancel(): void {
    if (quiet !== null) clearTimeout(quiet)
    if (idleId !== null) cancelIdle(idleId)
    quiet = idleId = null
  }
  function flush(): void {
    cancel()
    if (!pending) return
    pending = false
    run()
  }
  function schedule(): void {
    pending = true
    if (visible || printing) return flush()
    cancel()
    quiet = setTimeout(() => {
      quiet = null
      idleId = requestIdle(() => ((idleId = null), flush()))
    }, QUIET_MS)
  }
  const beforePrint = () => flush()

  onMounted(() => {
    if (typeof IntersectionObserver !== 'undefined' && el.value)
      unobserve = observe(el.value, (v) => {
        visible = v
        if (visible) flush()
      })
    window.addEventListener('beforeprint', beforePrint)
  })
  onBeforeUnmount(() => {
    unobserve?.()
    unobserve = null
    cancel()
    window.removeEventListener('beforeprint', beforePrint)
  })
  return { schedule, flush }
}

/**
 * A copy of `source` that follows it at once while `el` is on screen and catches up later while it is not
 * (see useVisibleWork). For tables and other markup whose re-render is the expensive part.
 */
export function useWhenVisible<T>(el: Ref<HTMLElement | null>, source: () => T): ShallowRef<T> {
  const shown = shallowRef(source())
  const work = useVisibleWork(el, () => {
    shown.value = source()
  })
  watch(source, () => work.schedule())
  return shown
}
