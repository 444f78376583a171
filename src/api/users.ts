// People (administration, admin only) — GET/POST/PATCH /api/users, reset-password, unlock.
import type { z } from 'zod';
import type { userCreateBodySchema, userPatchSchema } from '../../shared/schemas/auth';
import type { PersonView, PersonWithPassword } from '../../shared/schemas/responses';
import { api } from './client';

// The answers' types live in shared/schemas/responses.
export type { PersonView, PersonWithPassword };
export type PersonCreateBody = z.input<typeof userCreateBodySchema>;
export type PersonPatch = z.input<typeof userPatchSchema>;

// GET /api/users — everyone who can sign in, by name, with any sign-in lock still running.
export function listPeople(signal?: AbortSignal): Promise<PersonView[]> {
  return api.get<PersonView[]>('/users', { signal });
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
