// @vitest-environment happy-dom
/**
 * Focus after a page change (useRouteFocus): a new path puts focus on the new page's heading, also when the
 * heading renders only after the page's data; a change of query (tabs, pickers) leaves focus where it is; a
 * page that focuses a field itself keeps that.
 */
import { afterEach, describe, expect, it } from 'vitest'
import { defineComponent, h, ref, onMounted, nextTick } from 'vue'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { createMemoryHistory, createRouter, RouterView, type Router } from 'vue-router'
import { useRouteFocus } from '../../src/composables/useRouteFocus'

const later = ref(false)
const Home = defineComponent(
  () => () => h('main', [h('h1', 'Home'), h('a', { href: '#', id: 'link' }, 'Go')]),
)
const Slow = defineComponent(
  () => () => h('main', later.value ? [h('h1', 'Slow page')] : [h('p', 'Loading…')]),
)
const Form = defineComponent(() => {
  const input = ref<HTMLInputElement | null>(null)
  onMounted(() => input.value?.focus())
  return () => h('main', [h('h1', 'Form'), h('input', { ref: input, id: 'field' })])
})
const Layout = defineComponent({
  props: { router: { type: Object, required: true } },
  setup(props) {
    useRouteFocus(props.router as Router, () => document.getElementById('main-content'))
    return () =>
      h('div', [
        h('nav', [h('a', { href: '#', id: 'nav' }, 'Nav')]),
        h('div', { id: 'main-content' }, [h(RouterView)]),
      ])
  },
})

let wrapper: VueWrapper | null = null
afterEach(() => {
  wrapper?.unmount()
  wrapper = null
  later.value = false
})

async function app(): Promise<Router> {
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/', component: Home },
      { path: '/slow', component: Slow },
      { path: '/form', component: Form },
    ],
  })
  await router.push('/')
  wrapper = mount(Layout, { props: { router }, global: { plugins: [router] }, attachTo: document.body })
  await router.isReady()
  return router
}

const active = () => document.activeElement as HTMLElement | null

describe('focus after a page change', () => {
  it('moves focus from the menu to the new page’s heading, and leaves it there on a query change', async () => {
    const router = await app()
    document.getElementById('nav')!.focus()
    await router.push('/slow?x=1')
    await flushPromises()
    // The heading is not there yet: focus waits on the main region, then moves to the heading.
    expect(active()?.id).toBe('main-content')
    later.value = true
    await nextTick()
    await new Promise((ok) => setTimeout(ok, 0)) // the MutationObserver's callback
    expect(active()?.tagName).toBe('H1')
    expect(active()?.textContent).toBe('Slow page')
    expect(active()?.getAttribute('tabindex')).toBe('-1')

    // A query change (a tab, a picker) keeps focus where the person left it.
    document.getElementById('nav')!.focus()
    await router.replace('/slow?x=2')
    await flushPromises()
    expect(active()?.id).toBe('nav')
  })

  it('does not take focus from a field the page focused itself', async () => {
    const router = await app()
    document.getElementById('link')!.focus()
    await router.push('/form')
    await flushPromises()
    expect(active()?.id).toBe('field')
  })

  it('goes straight to a heading that is already there', async () => {
    const router = await app()
    await router.push('/form')
    await flushPromises()
    document.getElementById('nav')!.focus()
    await router.push('/')
    await flushPromises()
    expect(active()?.tagName).toBe('H1')
    expect(active()?.textContent).toBe('Home')
  })
})
