// The signed-in user and their token — the one piece of state every page shares.
import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import { ApiError, readStoredToken, writeStoredToken } from '../api/client';
import type { Role } from '../../shared/schemas/enums';
import type { SessionUser } from '../../shared/schemas/responses';
import type { PasswordChange } from '../../shared/schemas/auth';
import { changePassword as postPassword, login, logout, me } from '../api/auth';

export const useSessionStore = defineStore('session', () => {
  const token = ref<string | null>(readStoredToken());
  const user = ref<SessionUser | null>(null);
  /** Set when the stored token could not be checked because the server did not answer (not when it was refused). */
  const restoreError = ref<ApiError | null>(null);
  let restoring: Promise<void> | null = null;
  /** The server refused the token while a page was open: the page stays (its typed work with it) until the same
   * person signs in again over it, or signs out. Nothing is sent with a token meanwhile. */
  const expired = ref(false);

  const isSignedIn = computed(() => token.value !== null && user.value !== null);

  // True when the user holds at least one of the given roles.
  function hasRole(...roles: Role[]): boolean {
    const held = user.value?.roles ?? [];
    return roles.some((role) => held.includes(role));
  }

  // Sign in with e-mail and password; a refusal is thrown as ApiError for the form to show.
  async function signIn(email: string, password: string): Promise<SessionUser> {
    const answer = await login(email.trim(), password);
    writeStoredToken(answer.token);
    token.value = answer.token;
    user.value = answer.user;
    expired.value = false;
    restoreError.value = null;
    restoring = null;
    return answer.user;
  }

  /** Signed in with a one-time password: a new one must be chosen before any other page. */
  const mustChangePassword = computed(() => user.value?.mustChangePassword === true);

  // Replace one's own password; every older token ends, so the answer's new token replaces ours. Resolves to the user
  // with the duty cleared; a refusal is thrown as ApiError.
  async function changePassword(body: PasswordChange): Promise<SessionUser> {
    const answer = await postPassword(body);
    writeStoredToken(answer.token);
    token.value = answer.token;
    user.value = answer.user;
    return answer.user;
  }

  // Sign out: forget the token and the user here at once, and ask the server to end every token of this person
  // (POST /api/auth/logout). Signed out here even when the server cannot be reached or refuses.
  function signOut(): Promise<void> {
    const sent = token.value;
    forget();
    if (!sent) return Promise.resolve();
    return logout(sent).catch(() => undefined);
  }

  // Forget the token and the user here only (the server already refused the token).
  function forget(): void {
    writeStoredToken(null);
    token.value = null;
    user.value = null;
    expired.value = false;
    restoring = null;
  }

  // The token was refused mid-page: forget it (so no request sends it again) but keep the user and the page.
  function markExpired(): void {
    writeStoredToken(null);
    expired.value = true;
  }

  // After a page load: ask the server who the stored token belongs to. Runs once; a refused token signs out.
  function restore(): Promise<void> {
    if (!token.value || user.value) return Promise.resolve();
    if (restoring) return restoring;
    restoring = (async () => {
      try {
        user.value = await me();
        restoreError.value = null;
      } catch (error) {
        if (error instanceof ApiError && error.status === 401) {
          forget();
        } else {
          // The server is down or answered oddly: keep the token so a reload can succeed, but stay signed out for now.
          restoreError.value = error instanceof ApiError ? error : new ApiError(0, 'unknown', String(error));
          restoring = null;
        }
      }
    })();
    return restoring;
  }

  return { token, user, restoreError, expired, isSignedIn, mustChangePassword, hasRole, signIn, signOut, markExpired, restore, changePassword };
});
