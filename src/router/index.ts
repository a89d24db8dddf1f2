import { createRouter, createWebHistory, type Router } from 'vue-router'
import { routes } from './routes'

export function createAppRouter(): Router {
  const router = createRouter({
    history: createWebHistory(),
    routes,
    scrollBehavior: () => ({ top: 0 }),
  })
  router.afterEach((to) => {
    const title = typeof to.meta.title === 'string' ? to.meta.title : ''
    document.title = title ? `${title} · Ohmward` : 'Ohmward'
  })
  return router
}
