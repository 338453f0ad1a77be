import type { RouteRecordInfo, RouteRecordRaw } from 'vue-router'
import { ANY_ROLE, type Role } from '@shared/auth/roles'
import { PROJECT_PAGES, SHELL_PAGES } from './shellPages'

/** Who may open a route: anyone, or signed-in members with one of the roles. */
export type RouteAccess = 'public' | readonly Role[]

type NoParams = Record<never, never>
type ShellRoutes = {
  [Page in (typeof SHELL_PAGES)[number] as Page['name']]: RouteRecordInfo<Page['name'], Page['path'], NoParams, NoParams>
}

type ProjectParams = { projectId: string | number }
type ProjectParamsRaw = { projectId: string }
type ProjectRoutes = {
  [Page in (typeof PROJECT_PAGES)[number] as Page['name']]: RouteRecordInfo<Page['name'], Page['path'], ProjectParams, ProjectParamsRaw>
}

/** Every named route; `router.push({ name })` and `<RouterLink :to>` reject a name not listed here. */
export interface AppRouteMap extends ShellRoutes, ProjectRoutes {
  'sign-in': RouteRecordInfo<'sign-in', '/sign-in', NoParams, NoParams>
  verify: RouteRecordInfo<'verify', '/verify/:code?', { code?: string }, { code?: string }>
  'not-found': RouteRecordInfo<'not-found', '/:pathMatch(.*)*', { pathMatch: string | string[] }, { pathMatch: string[] }>
}
export type RouteName = keyof AppRouteMap

declare module 'vue-router' {
  interface TypesConfig {
    RouteNamedMap: AppRouteMap
  }
  interface RouteMeta {
    access: RouteAccess
    title: string
  }
}

export const routes: RouteRecordRaw[] = [
  {
    path: '/sign-in',
    name: 'sign-in',
    component: () => import('@/pages/SignInPage.vue'),
    meta: { access: 'public', title: 'Sign in' },
  },
  {
    // public: anyone holding a stamped sheet (an AHJ plan reviewer, an inspector) checks it here
    path: '/verify/:code?',
    name: 'verify',
    component: () => import('@/pages/VerifyPage.vue'),
    meta: { access: 'public', title: 'Verify a stamped plan set' },
  },
  {
    path: '/',
    component: () => import('@/components/AppShell.vue'),
    meta: { access: ANY_ROLE, title: 'Stringline' },
    children: [...SHELL_PAGES, ...PROJECT_PAGES].map((page) => ({
      path: page.path,
      name: page.name,
      component: page.component,
      meta: { access: page.roles, title: page.title },
    })),
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('@/pages/NotFoundPage.vue'),
    meta: { access: 'public', title: 'Page not found' },
  },
]
