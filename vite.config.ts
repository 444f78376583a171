import path from 'node:path';
import { defineConfig, type Plugin } from 'vite';
import vue from '@vitejs/plugin-vue';
import { quasar, transformAssetUrls } from '@quasar/vite-plugin';
import { constants } from 'node:zlib';
import { compression, defineAlgorithm } from 'vite-plugin-compression2';

// Which source modules each chunk holds (dist/.vite/chunk-modules.json, never served): a test reads it to check that the
// first page's chunks hold neither zod, papaparse, the chart library nor the screening engine.
function chunkModules(): Plugin {
  let root = process.cwd();
  return {
    name: 'gapsight-chunk-modules',
    apply: 'build',
    configResolved(config) {
      root = config.root;
    },
    generateBundle(_options, bundle) {
      const map: Record<string, string[]> = {};
      for (const [file, out] of Object.entries(bundle)) {
        if (out.type === 'chunk') map[file] = Object.keys(out.modules).map((id) => path.relative(root, id.replace(/\0/g, '')).split(path.sep).join('/'));
      }
      this.emitFile({ type: 'asset', fileName: '.vite/chunk-modules.json', source: JSON.stringify(map) });
    },
  };
}

// The client build. In development (`npm run dev`) /api is proxied to the Express server.
// Every text file is also written brotli- and gzip-compressed beside itself (`x.js.br`, `x.js.gz`): the server sends
// the one the browser accepts (server/app.ts). Fonts (woff2) are compressed already. The manifest
// (dist/.vite/manifest.json, never served) says which chunks each page loads; a test reads it.
export default defineConfig({
  plugins: [
    vue({ template: { transformAssetUrls } }),
    quasar(),
    chunkModules(),
    compression({
      // Brotli quality 10, not 11: 2 % larger files, a quarter of the build time.
      algorithms: [defineAlgorithm('brotliCompress', { params: { [constants.BROTLI_PARAM_QUALITY]: 10 } }), defineAlgorithm('gzip', { level: 9 })],
      include: /\.(js|mjs|css|html|svg|json)$/,
      exclude: /(^|[\\/])\.vite[\\/]/,
      logLevel: 'silent',
    }),
  ],
  build: { outDir: 'dist', chunkSizeWarningLimit: 1200, manifest: true },
  server: {
    host: '127.0.0.1',
    port: Number(process.env.VITE_PORT ?? 5173),
    proxy: { '/api': `http://127.0.0.1:${process.env.PORT ?? 8640}` },
  },
});
