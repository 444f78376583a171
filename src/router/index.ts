// The router: role guards from `meta.roles`, the session restored before the first page, and the one place a
// rejected token (401) ends the session and returns the user to sign-in.
import {
  createRouter,
  createWebHistory,
  type RouteLocationNormalized,
  type Router,
  type RouteRecordRaw,
  type RouterHistory,
} from 'vue-router';
import { Notify } from 'quasar';
import { setUnauthorizedHandler } from '../api/client';
import { useSessionStore } from '../stores/session';
import { safeRedirect } from './redirect';
import { routes } from './routes';

// Where a signed-out user should land: sign-in, remembering the page they asked for.
function signInLocation(to: RouteLocationNormalized) {
  return { name: 'sign-in', query: { redirect: to.fullPath } };
}

export interface AppRouterOptions {
  /** Browser history by default; tests pass a memory history. */
  history?: RouterHistory;
  /** The route table (tests may extend it with role-guarded entries). */
  routes?: RouteRecordRaw[];
}

// Build the app's router and install its guards and the session-expiry handler.
export function createAppRouter(options: AppRouterOptions = {}): Router {
  const router = createRouter({
    history: options.history ?? createWebHistory(import.meta.env.BASE_URL),
    routes: options.routes ?? routes,
  });

  router.beforeEach(async (to) => {
    const session = useSessionStore();
    await session.restore();
    if (to.meta.public) {
      // A signed-in user has no business on the sign-in form: continue where they were heading.
      if (to.name === 'sign-in' && session.isSignedIn) {
        return safeRedirect(to.query.redirect) ?? { name: 'desk' };
      }
      return true;
    }
    if (!session.isSignedIn) return signInLocation(to);
    // A one-time password allows nothing but choosing a new one.
    if (session.mustChangePassword && to.name !== 'password') {
      return { name: 'password', query: to.name === 'desk' ? {} : { redirect: to.fullPath } };
    }
    // `to.meta` merges parent and child meta, so roles set on a parent route also guard its children.
    const required = to.meta.roles;
    if (required?.length && !session.hasRole(...required)) {
      return { name: 'forbidden', query: { from: to.fullPath } };
    }
    return true;
  });

  router.afterEach((to) => {
    if (typeof document !== 'undefined') {
      document.title = to.meta.title ? `${to.meta.title} · Gapsight` : 'Gapsight';
    }
  });

  // 401 on a request that carried the current token: the token expired or the user was deactivated.
  setUnauthorizedHandler(() => {
    const session = useSessionStore();
    session.signOut();
    const current = router.currentRoute.value;
    // Before the first navigation has finished, the guard above sends the user to sign-in itself.
    if (current.matched.length === 0 || current.meta.public) return;
    Notify.create({ type: 'warning', message: 'Your session has ended. Please sign in again.', timeout: 6000 });
    void router.push(signInLocation(current));
  });

  return router;
}
