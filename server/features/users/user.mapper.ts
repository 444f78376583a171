import type { UserDto } from '../../../shared/schemas/auth.js';
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
    lastSignInAt: u.lastSignInAt ? u.lastSignInAt.toISOString() : null,
  };
}
