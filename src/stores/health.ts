// The server's health answer (demo data loaded? mail sink running?), fetched once and shared by the shell pages.
import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import { ApiError } from '../api/client';
import { health, type HealthStatus } from '../api/auth';

export const useHealthStore = defineStore('health', () => {
  const status = ref<HealthStatus | null>(null);
  const error = ref<ApiError | null>(null);
  let loading: Promise<void> | null = null;

  const demo = computed(() => status.value?.demo === true);
  const mailSink = computed(() => status.value?.mailSink === true);

  // Ask GET /api/health unless already asked; `force` asks again (e.g. a retry button).
  function load(force = false): Promise<void> {
    if (loading && !force) return loading;
    loading = (async () => {
      try {
        status.value = await health();
        error.value = null;
      } catch (caught) {
        status.value = null;
        error.value = caught instanceof ApiError ? caught : new ApiError(0, 'unknown', String(caught));
        loading = null; // let the next caller try again
      }
    })();
    return loading;
  }

  return { status, error, demo, mailSink, load };
});
