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
import { Dialog, Notify } from 'quasar';
import AppReauthDialog from '../components/AppReauthDialog.vue';
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
    // Leaving the page of an ended session (Back while the sign-in dialog is open): sign in on the sign-in page.
    if (session.expired) session.signOut();
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

  // Sign-in again over the page, so that a form half filled in is not thrown away; false when it cannot be shown.
  let reauthOpen = false;
  function askToSignInAgain(again = false): boolean {
    const session = useSessionStore();
    const user = session.user;
    if (!user) return false;
    if (reauthOpen && !again) return true;
    try {
      Dialog.create({ component: AppReauthDialog, componentProps: { email: user.email, name: user.name } })
        .onOk(() => {
          Notify.create({ type: 'positive', message: 'Signed in again. Carry on where you were; try the last step again if it failed.', timeout: 6000 });
        })
        .onCancel(() => {
          // The guard above signs the ended session out; a page that asks about unsaved work may keep the user here,
          // and then the question comes back.
          void router.push(signInLocation(router.currentRoute.value)).then((failure) => {
            if (failure && session.expired) askToSignInAgain(true);
          });
        })
        .onDismiss(() => {
          reauthOpen = false;
        });
    } catch {
      return false; // Quasar's dialogs are not installed (a test without the app): sign-in page as before
    }
    reauthOpen = true;
    session.markExpired();
    return true;
  }

  // 401 on a request that carried the current token: the token expired or the user was deactivated.
  setUnauthorizedHandler(() => {
    const session = useSessionStore();
    const current = router.currentRoute.value;
    // Before the first navigation has finished, the guard above sends the user to sign-in itself.
    if (current.matched.length === 0 || current.meta.public) {
      session.signOut();
      return;
    }
    // On a page: sign in again over it, what was typed stays.
    if (askToSignInAgain()) return;
    session.signOut();
    Notify.create({ type: 'warning', message: 'Your session has ended. Please sign in again.', timeout: 6000 });
    void router.push(signInLocation(current));
  });

  return router;
}
