import type { Component } from 'vue'
import { Box, Files, House, Location, Message, Postcard, Tickets, UserFilled } from '@element-plus/icons-vue'
import { ANY_ROLE, type Role } from '@shared/auth/roles'

/** A screen inside the signed-in shell. The routes and the side navigation are both built from this list. */
export interface ShellPage {
  readonly name: string
  readonly path: `/${string}`
  /** Navigation label and document title. */
  readonly title: string
  readonly icon: Component
  /** Roles that see the item and may open the page; the API checks again on every call. */
  readonly roles: readonly Role[]
  /** Each page is its own chunk, fetched when first opened. */
  readonly component: () => Promise<Component>
}

/** Adding a screen is one line here (and its page file). Order is navigation order. */
export const SHELL_PAGES = [
  { name: 'home', path: '/', title: 'Home', icon: House, roles: ANY_ROLE, component: () => import('@/pages/HomePage.vue') },
  { name: 'projects', path: '/projects', title: 'Projects', icon: Files, roles: ANY_ROLE, component: () => import('@/pages/ProjectsPage.vue') },
  { name: 'equipment', path: '/equipment', title: 'Equipment library', icon: Box, roles: ANY_ROLE, component: () => import('@/pages/EquipmentPage.vue') },
  { name: 'jurisdictions', path: '/jurisdictions', title: 'Jurisdictions', icon: Location, roles: ANY_ROLE, component: () => import('@/pages/JurisdictionsPage.vue') },
  { name: 'submissions', path: '/submissions', title: 'Submissions', icon: Tickets, roles: ['coordinator', 'admin'], component: () => import('@/pages/SubmissionsPage.vue') },
  { name: 'users', path: '/users', title: 'Users', icon: UserFilled, roles: ['admin'], component: () => import('@/pages/UsersPage.vue') },
  { name: 'mailbox', path: '/mailbox', title: 'Caught mail', icon: Message, roles: ['admin'], component: () => import('@/pages/MailboxPage.vue') },
  { name: 'profile', path: '/profile', title: 'My profile', icon: Postcard, roles: ANY_ROLE, component: () => import('@/pages/ProfilePage.vue') },
] as const satisfies readonly ShellPage[]

/** Screens inside the shell reached from another page rather than the navigation; each takes a project id. */
export const PROJECT_PAGES = [
  { name: 'project', path: '/projects/:projectId', title: 'Project', roles: ANY_ROLE, component: () => import('@/pages/ProjectPage.vue') },
  { name: 'project-design', path: '/projects/:projectId/design', title: 'Design', roles: ANY_ROLE, component: () => import('@/pages/DesignEditorPage.vue') },
  { name: 'project-package', path: '/projects/:projectId/package', title: 'Plan set', roles: ANY_ROLE, component: () => import('@/pages/ProjectPackagePage.vue') },
  { name: 'project-review', path: '/projects/:projectId/review', title: 'Review', roles: ANY_ROLE, component: () => import('@/pages/ProjectReviewPage.vue') },
] as const satisfies readonly Omit<ShellPage, 'icon'>[]

export type ShellPageEntry = (typeof SHELL_PAGES)[number]

/** The pages a role sees, in navigation order. */
export function pagesFor(role: Role): ShellPageEntry[] {
  return SHELL_PAGES.filter((page) => (page.roles as readonly Role[]).includes(role))
}
