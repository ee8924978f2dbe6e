// One Vite config: multi-page build (Directory at /, Console at /console/), the dev proxy
// for /api, and the Vitest projects (unit, reference, components, api, e2e).
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { type Plugin } from 'vite';
import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';
import { precompressDir } from './scripts/lib/precompress';

const root = path.dirname(fileURLToPath(import.meta.url));
const apiTarget = process.env.EMBERLINE_API_URL ?? `http://127.0.0.1:${process.env.PORT ?? '4000'}`;

/** `@/x` means `apps/<the importing app>/src/x`, so each app keeps its own alias. */
function perAppAlias(): Plugin {
  return {
    name: 'emberline-per-app-alias',
    enforce: 'pre',
    async resolveId(source, importer, options) {
      if (!source.startsWith('@/') || !importer) return null;
      const match = /[\\/]apps[\\/](directory|console)[\\/]/.exec(importer)
        ?? /[\\/]tests[\\/]unit[\\/](directory|console)[\\/]/.exec(importer);
      if (!match) return null;
      const target = path.join(root, 'apps', match[1]!, 'src', source.slice(2));
      return this.resolve(target, importer, { ...options, skipSelf: true });
    },
  };
}

/** In dev, /console/... is the Console's single-page app. */
function consoleFallback(): Plugin {
  return {
    name: 'emberline-console-fallback',
    configureServer(server) {
      server.middlewares.use((req, _res, next) => {
        const url = req.url ?? '';
        if (/^\/console(\/[^.]*)?(\?.*)?$/.test(url)) req.url = '/apps/console/index.html';
        next();
      });
    },
  };
}

/** After the build, brotli and gzip copies beside each text file, which the API serves as they are. */
function precompress(): Plugin {
  let outDir = '';
  let log = (message: string) => console.log(message);
  return {
    name: 'emberline-precompress',
    apply: 'build',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir);
      log = (message) => config.logger.info(message);
    },
    async closeBundle() {
      const r = await precompressDir(outDir);
      const kB = (n: number) => `${(n / 1024).toFixed(0)} kB`;
      log(`precompressed ${r.files} files: ${kB(r.bytes)} → brotli ${kB(r.brotliBytes)}, gzip ${kB(r.gzipBytes)}`);
    },
  };
}

export default defineConfig({
  root,
  plugins: [perAppAlias(), vue(), consoleFallback(), precompress()],
  resolve: {
    // vue-leaflet (with useGlobalLeaflet=false) loads Leaflet's ES build, but still names plain
    // "leaflet" for its global mode; pointing both at the ES build keeps one Leaflet chunk.
    alias: [{ find: /^leaflet$/, replacement: 'leaflet/dist/leaflet-src.esm.js' }],
  },
  server: {
    host: '127.0.0.1',
    port: Number(process.env.VITE_PORT ?? 5173),
    strictPort: true,
    proxy: { '/api': { target: apiTarget, changeOrigin: false } },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    chunkSizeWarningLimit: 500,
    rolldownOptions: {
      input: {
        directory: path.join(root, 'index.html'),
        console: path.join(root, 'apps/console/index.html'),
      },
      output: {
        // the framework both apps load on every page gets its own long-lived chunk, which also
        // keeps the shared chunk of app code under the 500 kB budget
        codeSplitting: {
          groups: [
            { name: 'vue', test: /node_modules[\\/](@vue|vue|vue-router|vue-i18n|@intlify|pinia)[\\/]/ },
            { name: 'zod', test: /node_modules[\\/]zod[\\/]/ },
            // the planner's chart engine loads only on that page; its renderer is a chunk of its own
            { name: 'zrender', test: /node_modules[\\/]zrender[\\/]/ },
          ],
        },
      },
    },
  },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          environment: 'node',
          include: ['tests/unit/domain/**/*.test.ts', 'tests/unit/api-client/**/*.test.ts', 'tests/unit/api/**/*.test.ts', 'tests/unit/scripts/**/*.test.ts', 'tests/reference/**/*.test.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'components',
          environment: 'happy-dom',
          setupFiles: ['tests/setup/components.ts'],
          include: ['tests/unit/directory/**/*.test.ts', 'tests/unit/console/**/*.test.ts', 'tests/unit/ui/**/*.test.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          environment: 'node',
          include: ['tests/api/**/*.test.ts', 'tests/faults/**/*.test.ts'],
          globalSetup: ['tests/setup/api-global-setup.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/setup/api-global-setup.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
