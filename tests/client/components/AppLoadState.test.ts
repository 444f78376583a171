import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { computed, defineComponent, h, ref, shallowRef } from 'vue';
import { createMemoryHistory, createRouter, createWebHistory } from 'vue-router';
import AppLoadState from '../../../src/components/AppLoadState.vue';
import { ApiError } from '../../../src/api/client';
import type { RouteResource } from '../../../src/composables/useRouteResource';
import { quasarOptions } from '../../../src/quasar-options';

// "Not found" always leaves a way out: the page's own links back, and the page the user came from.

const Blank = defineComponent({ render: () => h('div') });

function missing(): RouteResource<unknown> {
  const error = shallowRef<ApiError | null>(new ApiError(404, 'not_found', 'No such event.'));
  return {
    data: shallowRef(null),
    loading: ref(false),
    error,
    refreshError: shallowRef(null),
    notFound: computed(() => error.value?.status === 404),
    reload: async () => undefined,
  };
}

async function mountAt(path: string, from?: string) {
  // The browser's history (happy-dom's): vue-router keeps the previous page in each entry's state there.
  const router = createRouter({
    history: from ? createWebHistory() : createMemoryHistory(),
    routes: [
      { path: '/events', name: 'events', component: Blank },
      { path: '/units', name: 'units', component: Blank },
      { path: '/events/:id', name: 'event-file', component: Blank },
    ],
  });
  if (from) await router.push(from);
  await router.push(path);
  const wrapper = mount(AppLoadState, {
    props: {
      resource: missing(),
      name: 'event',
      notFoundText: 'There is no fault event with this number.',
      back: { name: 'events' },
      backLabel: 'Back to the events list',
      backLinks: [{ to: { name: 'units' }, label: 'Back to the fleet' }],
    },
    global: { plugins: [[Quasar, quasarOptions], router] },
  });
  return { wrapper, router };
}

describe('AppLoadState — not found', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('offers every way back it is given, as links', async () => {
    const { wrapper } = await mountAt('/events/999');
    const banner = wrapper.get('[data-test="event-error"][data-state="not-found"]');
    expect(banner.text()).toContain('There is no fault event with this number.');
    expect(banner.get('a[data-test="load-back"]').attributes('href')).toBe('/events');
    expect(banner.get('a[data-test="load-back"]').text()).toContain('Back to the events list');
    expect(banner.get('a[data-test="load-back-1"]').attributes('href')).toBe('/units');
    expect(banner.get('a[data-test="load-back-1"]').text()).toContain('Back to the fleet');
    // Opened directly (no page before it in the app): no "previous page".
    expect(banner.find('[data-test="load-previous"]').exists()).toBe(false);
  });

  it('leads back to the list the user came from, with its filters', async () => {
    const { wrapper, router } = await mountAt('/events/999', '/events?status=held&page=2');
    await wrapper.get('[data-test="load-previous"]').trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.fullPath).toBe('/events?status=held&page=2'));
  });
});
