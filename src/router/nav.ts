// The drawer's entries, read from the route table: every route with `meta.nav` the user may open.
import type { RouteMeta, RouteRecordRaw } from 'vue-router';
import type { Role } from '../api/auth';

export interface NavItem {
  name: string;
  label: string;
  icon: string;
  /** Highlight only on exactly this path (the desk at '/' would otherwise match every page). */
  exact: boolean;
}

export interface NavContext {
  hasRole: (...roles: Role[]) => boolean;
  mailSink: boolean;
}

function joinPath(parent: string, child: string): string {
  if (child.startsWith('/')) return child;
  const base = parent.endsWith('/') ? parent.slice(0, -1) : parent;
  return child ? `${base}/${child}` : base || '/';
}

// Walk the table in its own order; a child inherits its parent's meta as vue-router merges it (roles included).
export function buildNavItems(
  routes: readonly RouteRecordRaw[],
  context: NavContext,
  parentPath = '',
  parentMeta: RouteMeta = {},
): NavItem[] {
  const items: NavItem[] = [];
  for (const record of routes) {
    const meta: RouteMeta = { ...parentMeta, ...record.meta };
    const path = joinPath(parentPath, record.path);
    const nav = record.meta?.nav;
    const allowed = !meta.roles?.length || context.hasRole(...meta.roles);
    if (nav && typeof record.name === 'string' && allowed && (!nav.requiresMailSink || context.mailSink)) {
      items.push({ name: record.name, label: nav.label, icon: nav.icon, exact: path === '/' });
    }
    if (record.children?.length) items.push(...buildNavItems(record.children, context, path, meta));
  }
  return items;
}
