import { defineConfig } from 'vitest/config';
import { defaultClientConditions, defaultServerConditions } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { constants as zlib } from 'node:zlib';
import { compression, defineAlgorithm } from 'vite-plugin-compression2';

const apiPort = process.env.PORT ?? '3000';

// Vite's root is the repository root: index.html loads apps/web/src/main.tsx. The same file holds the
// vitest projects so every workspace's tests run from one place.
export default defineConfig({
  // The build also writes each text file compressed beside itself (.gz and .br), for the API to send to browsers
  // that accept them: a phone on the plant's Wi-Fi downloads the app's 155 kB of gzip, not its 520 kB.
  plugins: [
    react(),
    tailwindcss(),
    // Brotli at quality 9 rather than 11: about 7 % larger, for a quarter of the time it adds to the build.
    compression({
      algorithms: [
        defineAlgorithm('gzip', { level: 9 }),
        defineAlgorithm('brotliCompress', { params: { [zlib.BROTLI_PARAM_QUALITY]: 9 } }),
      ],
      threshold: 1024,
      logLevel: 'silent',
    }),
  ],
  // 'source' points workspace packages at their TypeScript (packages/domain exports it); setting conditions
  // replaces Vite's defaults, so they are listed again.
  resolve: { conditions: ['source', ...defaultClientConditions] },
  ssr: { resolve: { conditions: ['source', ...defaultServerConditions], externalConditions: ['source'] } },
  environments: {
    ssr: { resolve: { conditions: ['source', ...defaultServerConditions], externalConditions: ['source'] } },
  },
  build: {
    outDir: 'dist/web',
    emptyOutDir: true,
    // No source maps in the production build: the server would otherwise hand out the app's source (the API
    // also refuses any .map file left in the folder).
    sourcemap: false,
  },
  server: {
    port: 5173,
    proxy: { '/api': `http://127.0.0.1:${apiPort}` },
  },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'domain',
          environment: 'node',
          include: ['packages/domain/src/**/*.test.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'web',
          environment: 'jsdom',
          include: ['apps/web/src/**/*.test.{ts,tsx}'],
          setupFiles: ['apps/web/src/test-setup.ts'],
          testTimeout: 20000,
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          environment: 'node',
          include: ['apps/api/src/**/*.test.ts', 'tests/api/**/*.test.ts'],
          globalSetup: ['apps/api/src/test-support/global-setup.ts'],
          // One test database: files run one after another so fixtures never race.
          fileParallelism: false,
          testTimeout: 20000,
          hookTimeout: 30000,
        },
      },
      {
        extends: true,
        test: {
          name: 'browser',
          environment: 'node',
          include: ['tests/browser/**/*.test.ts'],
          globalSetup: ['tests/browser/global-setup.ts'],
          fileParallelism: false,
          testTimeout: 60000,
          hookTimeout: 120000,
        },
      },
    ],
    coverage: {
      provider: 'v8',
      include: ['packages/domain/src/**/*.ts'],
      exclude: ['packages/domain/src/**/*.test.ts', 'packages/domain/src/index.ts'],
      reporter: ['text-summary', 'text'],
      thresholds: { lines: 90 },
    },
  },
});
