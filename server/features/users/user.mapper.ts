import type { UserDto } from '../../../shared/schemas/auth.js';
import type { PersonView } from '../../../shared/schemas/responses/admin.js';
import type { User } from './user.entity.js';

/** The user as the API shows it (never the hash or the counters). */
export function toUserDto(u: User): UserDto {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    roles: u.roles,
    siteIds: (u.sites ?? []).map((s) => s.id).sort((a, b) => a - b),
    allSites: u.allSites,
    active: u.active,
    demo: u.demo,
    mustChangePassword: u.mustChangePassword,
    lastSignInAt: u.lastSignInAt ? u.lastSignInAt.toISOString() : null,
  };
}

/** The person as the administration shows them: the user and the end of a sign-in lock still running at `now`. */
export function toPersonView(u: User, now: Date): PersonView {
  const locked = u.lockedUntil !== null && new Date(u.lockedUntil).getTime() > now.getTime();
  return { ...toUserDto(u), lockedUntil: locked ? new Date(u.lockedUntil!).toISOString() : null } satisfies PersonView;
}
