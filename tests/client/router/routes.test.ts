import { describe, expect, it } from 'vitest';
import type { RouteRecordRaw } from 'vue-router';
import { routes } from '../../../src/router/routes';

function flatten(records: readonly RouteRecordRaw[]): RouteRecordRaw[] {
  return records.flatMap((record) => [record, ...flatten(record.children ?? [])]);
}

describe('route table', () => {
  const all = flatten(routes);
  const pages = all.filter((record) => !record.children?.length);

  it('names every page route, each name once', () => {
    const names = pages.map((record) => record.name);
    expect(names.every((name) => typeof name === 'string' && name.length > 0)).toBe(true);
    expect(new Set(names).size).toBe(names.length);
  });

  it('loads every page and layout lazily (a function returning a promise of the module)', async () => {
    for (const record of all.filter((r) => 'component' in r && r.component)) {
      const component = (record as { component: unknown }).component;
      expect(typeof component, String(record.name ?? record.path)).toBe('function');
      const loaded = (component as () => Promise<{ default: unknown }>)();
      expect(loaded).toBeInstanceOf(Promise);
      await expect(loaded).resolves.toHaveProperty('default');
    }
  });

  it('passes params to pages as props wherever a path has params', () => {
    const withParams = pages.filter((record) => /:/.test(record.path));
    expect(withParams.length).toBeGreaterThan(0);
    for (const record of withParams) expect(record.props, record.path).toBe(true);
  });

  it('keeps the catch-all not-found route last', () => {
    expect(all.at(-1)?.name).toBe('not-found');
    expect(all.at(-1)?.path).toBe(':pathMatch(.*)*');
  });

  it('has the shell pages: sign-in (public), desk, forbidden and not-found', () => {
    const byName = new Map(pages.map((record) => [record.name, record]));
    expect(byName.get('sign-in')?.path).toBe('/sign-in');
    expect(byName.get('sign-in')?.meta?.public).toBe(true);
    expect(byName.get('desk')?.meta?.nav).toEqual({ label: 'Desk', icon: 'space_dashboard' });
    expect(byName.has('forbidden')).toBe(true);
    expect(pages.filter((record) => record.meta?.public).map((record) => record.name)).toEqual(['sign-in']);
  });

  it('has the fleet, unit file, log-a-fault and event file pages, logging limited to protection and admin', () => {
    const byName = new Map(pages.map((record) => [record.name, record]));
    expect(byName.get('units')?.meta?.nav?.label).toBe('Fleet');
    expect(byName.get('unit-file')?.props).toBe(true);
    expect(byName.get('event-new')?.meta?.roles).toEqual(['protection', 'admin']);
    expect(byName.get('event-new')?.meta?.nav?.label).toBe('Log a fault');
    expect(byName.get('event-file')?.props).toBe(true);
  });

  it('has the events list at /events in everybody’s drawer', () => {
    const events = pages.find((record) => record.name === 'events');
    expect(events?.path).toBe('events');
    expect(events?.meta?.roles).toBeUndefined();
    expect(events?.meta?.nav?.label).toBe('Events');
  });

  it('has the outbox at /dev/outbox for admin and manager, in the drawer only while the mail sink runs', () => {
    const outbox = pages.find((record) => record.name === 'outbox');
    expect(outbox?.path).toBe('dev/outbox');
    expect(outbox?.meta?.roles).toEqual(['admin', 'manager']);
    expect(outbox?.meta?.nav).toEqual({ label: 'Outbox', icon: 'outbox', requiresMailSink: true });
  });
});
