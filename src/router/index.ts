import { createRouter, createWebHistory, type Router } from 'vue-router'
import { routes } from './routes'
import { useAuthStore } from '../stores/auth'
import { setUnauthorizedHandler } from '../api/http'

declare module 'vue-router' {
  interface RouteMeta {
    title?: string
    /** Signed-out users are sent to /sign-in?next=… and come back after signing in. */
    requiresAuth?: boolean
    /** Account role needed (admins pass every role check). */
    requiresRole?: 'advisor' | 'admin'
  }
}

export function createAppRouter(): Router {
  const router = createRouter({
    history: createWebHistory(),
    routes,
    scrollBehavior: () => ({ top: 0 }),
  })
  router.beforeEach(async (to) => {
    if (!to.meta.requiresAuth && !to.meta.requiresRole) return true
    const auth = useAuthStore()
    await auth.ensureLoaded()
    if (!auth.user) return { name: 'sign-in', query: { next: to.fullPath } }
    const need = to.meta.requiresRole
    if (need && auth.user.role !== 'admin' && auth.user.role !== need) return { name: 'home' }
    return true
  })
  // A 401 from any API call: the session ended (expired, or signed out elsewhere). Go to sign-in and come back.
  setUnauthorizedHandler(() => {
    useAuthStore().forget()
    const here = router.currentRoute.value
    if (here.meta.requiresAuth && here.name !== 'sign-in') {
      void router.push({ name: 'sign-in', query: { next: here.fullPath } })
    }
  })
  router.afterEach((to) => {
    const title = typeof to.meta.title === 'string' ? to.meta.title : ''
    document.title = title ? `${title} · Ohmward` : 'Ohmward'
  })
  return router
}
