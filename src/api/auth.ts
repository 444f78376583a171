// Sign-in, the current user and the server's health — the API calls the shell needs before anything else.
// Role comes from shared/schemas; the answer shapes follow /api/auth/* in the API contract (docs: product/api.md).
import type { Role } from '../../shared/schemas/roles';
import { api } from './client';

export type { Role };

export interface SessionUser {
  id: number;
  email: string;
  name: string;
  roles: Role[];
  /** The sites whose mail a manager receives (empty = all sites or not a manager). */
  siteIds: number[];
}

export interface LoginAnswer {
  token: string;
  user: SessionUser;
}

export interface HealthStatus {
  status: string;
  db: string;
  /** The invented Kestrel Valley demo data (and its demo accounts) is loaded. */
  demo: boolean;
  /** The local mail sink runs, so the outbox page has something to show. */
  mailSink: boolean;
}

// POST /api/auth/login — exchange e-mail and password for a token and the user.
export function login(email: string, password: string): Promise<LoginAnswer> {
  return api.post<LoginAnswer>('/auth/login', { email, password }, { auth: false });
}

// GET /api/auth/me — the user the stored token belongs to.
export function me(): Promise<SessionUser> {
  return api.get<SessionUser>('/auth/me');
}

// GET /api/health — is the server up, is the demo data loaded, does the mail sink run (no sign-in needed).
export function health(): Promise<HealthStatus> {
  return api.get<HealthStatus>('/health', { auth: false });
}
