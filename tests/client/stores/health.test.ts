import { createPinia, setActivePinia } from 'pinia';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { useHealthStore } from '../../../src/stores/health';
import { healthyDemo, resetClientState, scriptFetch } from '../helpers';

describe('useHealthStore', () => {
  beforeEach(() => setActivePinia(createPinia()));
  afterEach(resetClientState);

  it('asks GET /api/health once and exposes the demo and mail-sink flags', async () => {
    const { requests } = scriptFetch({ 'GET /api/health': { body: healthyDemo } });
    const store = useHealthStore();

    await Promise.all([store.load(), store.load()]);

    expect(requests).toHaveLength(1);
    expect(store.demo).toBe(true);
    expect(store.mailSink).toBe(true);
  });

  it('reports no demo data when the server says demo: false', async () => {
    scriptFetch({ 'GET /api/health': { body: { status: 'ok', db: 'ok', demo: false, mailSink: false } } });
    const store = useHealthStore();

    await store.load();

    expect(store.demo).toBe(false);
    expect(store.mailSink).toBe(false);
    expect(store.error).toBeNull();
  });

  it('keeps the error of a failed check (database down) and asks again on the next load', async () => {
    const { requests } = scriptFetch({ 'GET /api/health': { status: 503, body: { status: 'degraded', db: 'down' } } });
    const store = useHealthStore();

    await store.load();
    expect(store.error).toMatchObject({ status: 503 });
    expect(store.demo).toBe(false);

    await store.load();
    expect(requests).toHaveLength(2);
  });
});
