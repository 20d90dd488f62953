import {
  createRouter,
  createWebHistory,
  type RouteLocationRaw,
  type RouteRecordRaw,
  type Router,
  type RouterHistory,
} from 'vue-router'
import type { Role } from '@shared/schemas/common.schema'
import { ApiError } from '@/api/client'
import { useSessionStore } from '@/stores/session'
// The two screens the app opens on (Train signed in, sign-in signed out) come with the entry
// chunk: one round trip less on a slow gym network. Every other view loads when it is visited.
import TrainView from '@/views/TrainView.vue'
import SignInView from '@/views/SignInView.vue'

export type RouteName =
  | 'home'
  | 'sign-in'
  | 'register'
  | 'train'
  | 'session-run'
  | 'session-summary'
  | 'logbook'
  | 'session-detail'
  | 'exercise-history'
  | 'logbook-import'
  | 'plan'
  | 'athletes'
  | 'athlete-detail'
  | 'athlete-gym'
  | 'athlete-start-loads'
  | 'review-desk'
  | 'session-review'
  | 'plans'
  | 'plan-edit'
  | 'me'
  | 'my-gym'
  | 'admin-users'
  | 'invite-accept'
  | 'forgot-password'
  | 'reset-password'
  | 'not-found'

declare module 'vue-router' {
  interface RouteMeta {
    /** Shown in the browser tab as "<title> · Chalkline". */
    title?: string
    requiresAuth?: boolean
    /** Roles allowed in; others go to their own home. Absent: every signed-in role. */
    roles?: Role[]
    /** Sign-in and register: a signed-in user goes home instead. */
    guestOnly?: boolean
    /** Full-screen pages without the bottom tab bar. */
    hideTabBar?: boolean
  }
}

const HOME_BY_ROLE: Record<Role, RouteName> = { lifter: 'train', coach: 'athletes', admin: 'admin-users' }

export function homeRouteFor(role: Role): { name: RouteName } {
  return { name: HOME_BY_ROLE[role] }
}

type NamedRoute = RouteRecordRaw & { name: RouteName }

export const routes: NamedRoute[] = [
  { path: '/', name: 'home', redirect: { name: 'train' } },
  {
    path: '/sign-in',
    name: 'sign-in',
    component: SignInView,
    meta: { title: 'Sign in', guestOnly: true, hideTabBar: true },
  },
  {
    path: '/register',
    name: 'register',
    component: () => import('@/views/RegisterView.vue'),
    meta: { title: 'Create an account', guestOnly: true, hideTabBar: true },
  },
  {
    path: '/train',
    name: 'train',
    component: TrainView,
    meta: { title: 'Train', requiresAuth: true, roles: ['lifter'] },
  },
  {
    path: '/train/session',
    name: 'session-run',
    component: () => import('@/views/SessionRunView.vue'),
    meta: { title: 'Session', requiresAuth: true, roles: ['lifter'], hideTabBar: true },
  },
  {
    path: '/train/session/:id(\\d+)/summary',
    name: 'session-summary',
    component: () => import('@/views/SessionSummaryView.vue'),
    props: (route) => ({ id: Number(route.params.id) }),
    meta: { title: 'Session summary', requiresAuth: true, roles: ['lifter'], hideTabBar: true },
  },
  {
    path: '/logbook',
    name: 'logbook',
    component: () => import('@/views/LogbookView.vue'),
    meta: { title: 'Logbook', requiresAuth: true, roles: ['lifter'] },
  },
  {
    path: '/logbook/:id(\\d+)',
    name: 'session-detail',
    component: () => import('@/views/SessionDetailView.vue'),
    props: (route) => ({ id: Number(route.params.id) }),
    // Coaches open their athletes' sessions from the athlete page; the server checks the link.
    meta: { title: 'Session', requiresAuth: true, roles: ['lifter', 'coach'] },
  },
  {
    path: '/logbook/exercise/:exerciseId(\\d+)',
    name: 'exercise-history',
    component: () => import('@/views/ExerciseHistoryView.vue'),
    props: (route) => ({ exerciseId: Number(route.params.exerciseId) }),
    meta: { title: 'Lift history', requiresAuth: true, roles: ['lifter'] },
  },
  {
    path: '/logbook/import',
    name: 'logbook-import',
    component: () => import('@/views/LogbookImportView.vue'),
    meta: { title: 'Import a logbook', requiresAuth: true, roles: ['lifter'] },
  },
  {
    path: '/plan',
    name: 'plan',
    component: () => import('@/views/PlanView.vue'),
    meta: { title: 'Plan', requiresAuth: true, roles: ['lifter'] },
  },
  {
    path: '/athletes',
    name: 'athletes',
    component: () => import('@/views/AthletesView.vue'),
    meta: { title: 'Athletes', requiresAuth: true, roles: ['coach'] },
  },
  {
    path: '/athletes/:id(\\d+)',
    name: 'athlete-detail',
    component: () => import('@/views/AthleteDetailView.vue'),
    props: (route) => ({ id: Number(route.params.id) }),
    meta: { title: 'Athlete', requiresAuth: true, roles: ['coach'] },
  },
  {
    path: '/athletes/:id(\\d+)/gym',
    name: 'athlete-gym',
    component: () => import('@/views/AthleteGymView.vue'),
    props: (route) => ({ id: Number(route.params.id) }),
    meta: { title: "Athlete's gym", requiresAuth: true, roles: ['coach'] },
  },
  {
    path: '/athletes/:id(\\d+)/start-loads',
    name: 'athlete-start-loads',
    component: () => import('@/views/AthleteStartLoadsView.vue'),
    props: (route) => ({ id: Number(route.params.id) }),
    meta: { title: 'Starting loads', requiresAuth: true, roles: ['coach'] },
  },
  {
    path: '/review',
    name: 'review-desk',
    component: () => import('@/views/ReviewDeskView.vue'),
    meta: { title: 'Review desk', requiresAuth: true, roles: ['coach'] },
  },
  {
    path: '/review/:id(\\d+)',
    name: 'session-review',
    component: () => import('@/views/SessionReviewView.vue'),
    props: (route) => ({ id: Number(route.params.id) }),
    meta: { title: 'Session review', requiresAuth: true, roles: ['coach'] },
  },
  {
    path: '/plans',
    name: 'plans',
    component: () => import('@/views/PlansView.vue'),
    meta: { title: 'Plans', requiresAuth: true, roles: ['coach'] },
  },
  {
    path: '/plans/:id(\\d+)',
    name: 'plan-edit',
    component: () => import('@/views/PlanEditView.vue'),
    props: (route) => ({ id: Number(route.params.id) }),
    meta: { title: 'Plan editor', requiresAuth: true, roles: ['coach', 'lifter'], hideTabBar: true },
  },
  {
    path: '/me',
    name: 'me',
    component: () => import('@/views/MeView.vue'),
    meta: { title: 'Me', requiresAuth: true },
  },
  {
    path: '/me/gym',
    name: 'my-gym',
    component: () => import('@/views/MyGymView.vue'),
    meta: { title: 'My gym', requiresAuth: true, roles: ['lifter'] },
  },
  {
    path: '/admin',
    name: 'admin-users',
    component: () => import('@/views/AdminUsersView.vue'),
    meta: { title: 'Accounts', requiresAuth: true, roles: ['admin'] },
  },
  {
    path: '/invite/:token',
    name: 'invite-accept',
    component: () => import('@/views/InviteAcceptView.vue'),
    props: true,
    meta: { title: 'Invitation', hideTabBar: true },
  },
  {
    path: '/forgot-password',
    name: 'forgot-password',
    component: () => import('@/views/ForgotPasswordView.vue'),
    meta: { title: 'Forgot your password?', guestOnly: true, hideTabBar: true },
  },
  {
    path: '/reset-password/:token',
    name: 'reset-password',
    component: () => import('@/views/PasswordResetView.vue'),
    props: true,
    meta: { title: 'Set a new password', hideTabBar: true },
  },
  { path: '/:pathMatch(.*)*', name: 'not-found', redirect: { name: 'home' } },
]

/** Whether this address opens the Train screen (directly, or through the home redirect). */
export function opensOnTrain(router: Router, path: string): boolean {
  const name = router.resolve(path).name
  return name === 'train' || name === 'home'
}

/** Builds the router with its guards; tests pass a memory history. */
export function createAppRouter(history: RouterHistory = createWebHistory(import.meta.env.BASE_URL)): Router {
  const router = createRouter({ history, routes })

  router.beforeEach(async (to): Promise<true | RouteLocationRaw> => {
    const session = useSessionStore()

    // A token from an earlier visit: learn who it belongs to before deciding.
    if (session.isSignedIn && !session.user) {
      try {
        await session.fetchMe()
      } catch (error) {
        if (error instanceof ApiError && error.status === 401) session.clear()
      }
    }

    const user = session.user
    if (to.meta.guestOnly && user) return homeRouteFor(user.role)
    if (!to.meta.requiresAuth) return true
    if (!user) return { name: 'sign-in', query: { redirect: to.fullPath } }
    if (to.meta.roles && !to.meta.roles.includes(user.role)) return homeRouteFor(user.role)
    return true
  })

  router.afterEach((to) => {
    document.title = to.meta.title ? `${to.meta.title} · Chalkline` : 'Chalkline'
  })

  return router
}
