import { afterEach, describe, expect, it } from 'vitest';
import { effectScope, nextTick, ref, type EffectScope } from 'vue';
import { ApiError } from '../../../src/api/client';
import { useRouteResource } from '../../../src/composables/useRouteResource';
import { settle } from '../helpers';

interface Call {
  key: number;
  signal: AbortSignal;
  resolve: (value: string) => void;
  reject: (error: unknown) => void;
}

// A loader whose answers the test gives by hand, one call at a time.
function handLoader() {
  const calls: Call[] = [];
  const loader = (key: number, signal: AbortSignal) =>
    new Promise<string>((resolve, reject) => {
      calls.push({ key, signal, resolve, reject });
    });
  return { calls, loader };
}

let scope: EffectScope | null = null;
afterEach(() => scope?.stop());

function start(initial: number | null) {
  const key = ref<number | null>(initial);
  const { calls, loader } = handLoader();
  scope = effectScope();
  const resource = scope.run(() => useRouteResource(() => key.value, loader))!;
  return { key, calls, resource };
}

describe('useRouteResource', () => {
  it('clears the data at once when the key changes, aborts the request of the old key and ignores its late answer', async () => {
    const { key, calls, resource } = start(1);
    calls[0].resolve('event 1');
    await settle();
    expect(resource.data.value).toBe('event 1');

    key.value = 2;
    await nextTick();
    expect(resource.data.value).toBeNull();
    expect(resource.loading.value).toBe(true);
    expect(calls.map((c) => c.key)).toEqual([1, 2]);

    key.value = 3;
    await nextTick();
    expect(calls[1].signal.aborted).toBe(true);
    calls[1].resolve('event 2, late');
    calls[2].resolve('event 3');
    await settle();
    expect(resource.data.value).toBe('event 3');
    expect(calls[2].signal.aborted).toBe(false);
  });

  it('says not found on a 404 for the key, with no data', async () => {
    const { calls, resource } = start(9);
    calls[0].reject(new ApiError(404, 'not_found', 'No such event.'));
    await settle();
    expect(resource.notFound.value).toBe(true);
    expect(resource.data.value).toBeNull();
    expect(resource.refreshError.value).toBeNull();
  });

  it('keeps the loaded data when a reload of the same key fails and says so in refreshError; a good reload clears it', async () => {
    const { calls, resource } = start(1);
    calls[0].resolve('first');
    await settle();

    const failed = resource.reload();
    expect(resource.data.value).toBe('first');
    calls[1].reject(new ApiError(503, 'unavailable', 'Busy.'));
    await failed;
    expect(resource.data.value).toBe('first');
    expect(resource.refreshError.value?.message).toBe('Busy.');
    expect(resource.error.value).toBeNull();

    const again = resource.reload();
    calls[2].resolve('second');
    await again;
    expect(resource.data.value).toBe('second');
    expect(resource.refreshError.value).toBeNull();
  });

  it('loads nothing while the key is null', async () => {
    const { key, calls, resource } = start(null);
    await settle();
    expect(calls).toHaveLength(0);
    expect(resource.loading.value).toBe(false);
    key.value = 4;
    await nextTick();
    expect(calls.map((c) => c.key)).toEqual([4]);
  });
});
