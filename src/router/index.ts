import { createRouter, createWebHistory, type Router, type RouterHistory } from 'vue-router'
import { useAuthStore } from '@/stores/auth'
import { safeNextPath } from './access'
import { PRODUCT_NAME } from '@/product'
import { routes } from './routes'

/**
 * Signed-out visitors of a members' route go to sign-in with `?next=` so they land where they
 * were going; signed-in visitors of sign-in go on. Role checks happen in the shell, which shows
 * a "not allowed" message instead of the page.
 */
export function installSessionGuard(router: Router): void {
  router.beforeEach(async (to) => {
    const auth = useAuthStore()
    await auth.restore()
    if (to.meta.access === 'public') {
      if (to.name === 'sign-in' && auth.isSignedIn) return safeNextPath(to.query.next) ?? { name: 'home' }
      return true
    }
    if (auth.isSignedIn) return true
    return { name: 'sign-in', query: to.fullPath === '/' ? {} : { next: to.fullPath } }
  })
  router.afterEach((to) => {
    document.title = `${to.meta.title} · ${PRODUCT_NAME}`
  })
}

export function createAppRouter(history: RouterHistory = createWebHistory(import.meta.env.BASE_URL)): Router {
  const router = createRouter({ history, routes, scrollBehavior: () => ({ top: 0 }) })
  installSessionGuard(router)
  return router
}
