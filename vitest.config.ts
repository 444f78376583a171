import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';
import { quasar, transformAssetUrls } from '@quasar/vite-plugin';

// Four projects: pure engine, API against a real MariaDB (one file at a time), client components, browser.
export default defineConfig({
  test: {
    projects: [
      // Pure functions (no I/O, no mocks, no globals): every file in one worker without a fresh module graph each.
      { test: { name: 'shared', environment: 'node', include: ['tests/shared/**/*.test.ts'], isolate: false } },
      {
        test: {
          name: 'server',
          environment: 'node',
          include: ['tests/server/**/*.test.ts'],
          fileParallelism: false,
          testTimeout: 30000,
          hookTimeout: 60000,
        },
      },
      {
        plugins: [vue({ template: { transformAssetUrls } }), quasar()],
        // Mounting a page cold (transform + Quasar) can take seconds on a loaded 2-core machine: generous limits.
        test: { name: 'client', environment: 'happy-dom', include: ['tests/client/**/*.test.ts'], setupFiles: ['tests/client/setup.ts'], testTimeout: 30000, hookTimeout: 60000 },
      },
      {
        test: {
          name: 'e2e',
          environment: 'node',
          // A database of its own: its app server runs a mail worker, and the demo flow changes the demo events.
          env: { DB_NAME: 'gapsight_e2e' },
          include: ['tests/e2e/**/*.test.ts'],
          fileParallelism: false,
          testTimeout: 60000,
          hookTimeout: 120000,
        },
      },
    ],
  },
});
