// People (administration, admin only) — GET/POST/PATCH /api/users, reset-password, unlock.
import type { z } from 'zod';
import type { userCreateBodySchema, userListQuerySchema, userPatchSchema } from '../../shared/schemas/auth';
import type { PersonPage, PersonView, PersonWithPassword } from '../../shared/schemas/responses';
import { api } from './client';

// The answers' types live in shared/schemas/responses.
export type { PersonPage, PersonView, PersonWithPassword };
export type PersonListQuery = Omit<z.input<typeof userListQuerySchema>, 'page' | 'pageSize'> & { page?: number; pageSize?: number };
export type PersonCreateBody = z.input<typeof userCreateBodySchema>;
export type PersonPatch = z.input<typeof userPatchSchema>;

// GET /api/users — one page of people by name (search by name or e-mail, role, active), with any sign-in lock running.
export function listPeople(query: PersonListQuery = {}, signal?: AbortSignal): Promise<PersonPage> {
  return api.get<PersonPage>('/users', { query, signal });
}

// POST /api/users — a new person; the answer carries their one-time password, this once.
export function createPerson(body: PersonCreateBody): Promise<PersonWithPassword> {
  return api.post<PersonWithPassword>('/users', body);
}

// PATCH /api/users/:id — name, roles, sites, active.
export function updatePerson(id: number, patch: PersonPatch): Promise<PersonView> {
  return api.patch<PersonView>(`/users/${id}`, patch);
}

// POST /api/users/:id/reset-password — a new one-time password, answered this once.
export function resetPassword(id: number): Promise<PersonWithPassword> {
  return api.post<PersonWithPassword>(`/users/${id}/reset-password`);
}

// POST /api/users/:id/unlock — end a sign-in lock after too many failures.
export function unlockPerson(id: number): Promise<PersonView> {
  return api.post<PersonView>(`/users/${id}/unlock`);
}
