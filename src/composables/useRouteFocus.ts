/**
 * Keyboard and screen-reader focus across page changes. A client-side navigation removes the link that was
 * activated, so focus would fall back to <body> and the next Tab would start again at the top of the
 * document. After every change of path (not of query or hash: tabs and pickers keep their own focus), focus
 * moves to the new page's main heading, or to the main region until the heading has rendered, unless the page
 * already put focus somewhere inside itself (an autofocus field). The skip link uses the same target.
 */
import { nextTick, onBeforeUnmount } from 'vue'
import type { Router } from 'vue-router'

/** Marks the element focus was moved to; app.scss leaves these without an outline (they are not controls). */
export const FOCUS_TARGET_ATTR = 'data-route-focus'
/** How long to wait for a page's heading after its data starts loading. [ms] */
const HEADING_WAIT_MS = 10_000

function mainHeading(root: HTMLElement): HTMLElement | null {
  return root.querySelector<HTMLElement>('h1')
}

function focusWithoutScroll(el: HTMLElement): void {
  if (!el.hasAttribute('tabindex')) el.setAttribute('tabindex', '-1')
  el.setAttribute(FOCUS_TARGET_ATTR, '')
  el.focus({ preventScroll: true })
}

/** Focus the main heading inside `root`, or `root` itself and then the heading once it renders. */
export function focusMain(root: HTMLElement, waitMs = HEADING_WAIT_MS): () => void {
  const heading = mainHeading(root)
  if (heading) {
    focusWithoutScroll(heading)
    return () => {}
  }
  focusWithoutScroll(root)
  const observer = new MutationObserver(() => {
    // Someone (the person, or the page) moved focus meanwhile: leave it where it is.
    if (document.activeElement !== root) return stop()
    const h = mainHeading(root)
    if (h) {
      focusWithoutScroll(h)
      stop()
    }
  })
  const timer = setTimeout(() => stop(), waitMs)
  function stop(): void {
    observer.disconnect()
    clearTimeout(timer)
  }
  observer.observe(root, { childList: true, subtree: true })
  return stop
}

/** Focus already inside the page (an autofocus field, a dialog the page opened) is left alone. */
function pageTookFocus(root: HTMLElement): boolean {
  const active = document.activeElement
  return !!active && active !== root && active !== document.body && root.contains(active)
}

/** Installs the route-change focus rule; call in the layout's setup with its main region. */
export function useRouteFocus(router: Router, getRoot: () => HTMLElement | null): void {
  let stopWaiting: () => void = () => {}
  const remove = router.afterEach((to, from, failure) => {
    if (failure) return
    // The first page load: the browser starts at the top, where the skip link is.
    if (from.matched.length === 0) return
    if (to.path === from.path) return
    void nextTick(() => {
      const root = getRoot()
      if (!root || pageTookFocus(root)) return
      stopWaiting()
      stopWaiting = focusMain(root)
    })
  })
  onBeforeUnmount(() => {
    stopWaiting()
    remove()
  })
}
