import { defineConfig } from 'vite';
import vue from '@vitejs/plugin-vue';
import { quasar, transformAssetUrls } from '@quasar/vite-plugin';

// The client build. In development (`npm run dev`) /api is proxied to the Express server.
export default defineConfig({
  plugins: [vue({ template: { transformAssetUrls } }), quasar()],
  build: { outDir: 'dist', chunkSizeWarningLimit: 1200 },
  server: {
    host: '127.0.0.1',
    port: Number(process.env.VITE_PORT ?? 5173),
    proxy: { '/api': `http://127.0.0.1:${process.env.PORT ?? 8640}` },
  },
});
