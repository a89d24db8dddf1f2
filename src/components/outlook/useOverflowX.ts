/**
 * True while an element is wider than its box (a table on a phone), so the page can say that more columns
 * follow to the right: a scroll bar alone is easy to miss on a touch screen.
 */
import { onBeforeUnmount, onMounted, ref, type Ref } from 'vue'

export function useOverflowX(root: Ref<HTMLElement | null>, selector?: string): Ref<boolean> {
  const overflowing = ref(false)
  let observer: ResizeObserver | null = null
  const target = () => (selector ? root.value?.querySelector(selector) : root.value) ?? null
  function measure(): void {
    const el = target()
    overflowing.value = !!el && el.scrollWidth > el.clientWidth + 4
  }
  onMounted(() => {
    if (typeof ResizeObserver === 'undefined' || !root.value) return
    observer = new ResizeObserver(measure)
    observer.observe(root.value)
    // The table inside may grow without the box changing size (a new column of results).
    const inner = target()
    if (inner && inner !== root.value) observer.observe(inner.firstElementChild ?? inner)
    measure()
  })
  onBeforeUnmount(() => observer?.disconnect())
  return overflowing
}
