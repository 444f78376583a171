import type { UserDto } from '../../../shared/schemas/auth.js';
import type { Role } from '../../../shared/schemas/enums.js';
import type { PersonView } from '../../../shared/schemas/responses/admin.js';
import type { User } from './user.entity.js';

/** The user as the API shows it (never the hash or the counters), from the entity or a session row's fields. */
export function toUserDto(
  u: Pick<User, 'id' | 'email' | 'name' | 'roles' | 'allSites' | 'active' | 'demo' | 'mustChangePassword' | 'lastSignInAt'> & { sites?: { id: number }[] },
): UserDto {
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

/** The columns of `user` a session needs (UserDto, plus the token version), as one row of a raw query. */
export interface SessionUserRow {
  id: number;
  email: string;
  name: string;
  roles: string | Role[];
  siteIds: string | Buffer | null;
  allSites: number | boolean;
  active: number | boolean;
  demo: number | boolean;
  mustChangePassword: number | boolean;
  tokenVersion: number;
  lastSignInAt: Date | null;
}

/** The SELECT list of a SessionUserRow over `user` as `u` (its sites as one comma-separated, ordered text). */
export const SESSION_USER_COLUMNS =
  'u.id, u.email, u.name, u.roles, u.allSites, u.active, u.demo, u.mustChangePassword, u.tokenVersion, u.lastSignInAt, ' +
  '(SELECT GROUP_CONCAT(us.siteId ORDER BY us.siteId SEPARATOR \',\') FROM user_site us WHERE us.userId = u.id) AS siteIds';

/** A SessionUserRow as the API shows the user (the same answer as toUserDto of the entity) and its token version. */
export function sessionUserFromRow(r: SessionUserRow): { dto: UserDto; tokenVersion: number } {
  const sites = r.siteIds === null ? '' : String(r.siteIds);
  return {
    dto: toUserDto({
      id: Number(r.id),
      email: r.email,
      name: r.name,
      roles: typeof r.roles === 'string' ? (JSON.parse(r.roles) as Role[]) : r.roles,
      sites: sites ? sites.split(',').map((id) => ({ id: Number(id) })) : [],
      allSites: Boolean(r.allSites),
      active: Boolean(r.active),
      demo: Boolean(r.demo),
      mustChangePassword: Boolean(r.mustChangePassword),
      lastSignInAt: r.lastSignInAt ? new Date(r.lastSignInAt) : null,
    }),
    tokenVersion: Number(r.tokenVersion),
  };
}

/** The person as the administration shows them: the user and the end of a sign-in lock still running at `now`. */
export function toPersonView(u: User, now: Date): PersonView {
  const locked = u.lockedUntil !== null && new Date(u.lockedUntil).getTime() > now.getTime();
  return { ...toUserDto(u), lockedUntil: locked ? new Date(u.lockedUntil!).toISOString() : null } satisfies PersonView;
}
