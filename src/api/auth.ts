// Sign-in, the current user and the server's health — the API calls the shell needs before anything else.
// The answers' types live in shared/schemas/responses (the server's views are checked against the same schemas).
import type { HealthAnswer, LoginAnswer, SecurityEventPage, SecurityEventView, SessionUser } from '../../shared/schemas/responses';
import type { PasswordChange } from '../../shared/schemas/auth';
import { api } from './client';

export type { Role } from '../../shared/schemas/enums';
export type { LoginAnswer, SecurityEventPage, SecurityEventView, SessionUser };
/** Is the server up, is the demo data loaded, does the mail sink run. */
export type HealthStatus = HealthAnswer;

// POST /api/auth/login — exchange e-mail and password for a token and the user.
export function login(email: string, password: string): Promise<LoginAnswer> {
  return api.post<LoginAnswer>('/auth/login', { email, password }, { auth: false });
}

// GET /api/auth/me — the user the stored token belongs to.
export function me(): Promise<SessionUser> {
  return api.get<SessionUser>('/auth/me');
}

// POST /api/auth/password — replace one's own password (a one-time password first of all). Every older token ends, so
// the answer is a new token and the user, as a sign-in answers.
export function changePassword(body: PasswordChange): Promise<LoginAnswer> {
  return api.post<LoginAnswer>('/auth/password', body);
}

// POST /api/auth/logout — end every token of the signed-in person (204). Sent with the given token (already forgotten
// here), so a refusal does not count as a session ending mid-page.
export function logout(token: string): Promise<void> {
  return api.post<void>('/auth/logout', undefined, { auth: false, headers: { Authorization: `Bearer ${token}` } });
}

// GET /api/security-events — one page of the security log, newest first (administrators).
export function listSecurityEvents(query: { page: number; pageSize: number }, signal?: AbortSignal): Promise<SecurityEventPage> {
  return api.get<SecurityEventPage>('/security-events', { query, signal });
}

// GET /api/health — is the server up, is the demo data loaded, does the mail sink run (no sign-in needed).
export function health(): Promise<HealthStatus> {
  return api.get<HealthStatus>('/health', { auth: false });
}
