import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';

// One config for the client build and for vitest.
export default defineConfig({
  plugins: [vue()],
  build: {
    outDir: 'dist/client',
    emptyOutDir: true,
    chunkSizeWarningLimit: 2000,
    rollupOptions: {
      output: {
        // zod and the module that makes it jitless share one chunk, so `z.config({ jitless: true })` runs before any
        // chunk builds a schema: otherwise zod probes `new Function` once, which the Content-Security-Policy reports.
        manualChunks: (id: string) =>
          /[\\/]node_modules[\\/]zod[\\/]|[\\/]src[\\/]zodJitless\.ts$/.test(id) ? 'zod' : undefined,
      },
    },
  },
  worker: { format: 'es' },
  server: { port: 5173 },
  test: {
    include: ['tests/**/*.test.ts'],
    // The every-screen check (every role, every screen, three widths) runs with `npm run test:screens`.
    exclude: process.env.NW_SCREENS ? ['**/node_modules/**'] : ['**/node_modules/**', 'tests/e2e/screens.e2e.test.ts'],
    environment: 'node',
    pool: 'forks',
    // Two test files at once: most of them wait on child processes, browsers and timers, so on a 2-core machine the
    // suite takes 674 s instead of 1,133 s with vitest's default of one worker (cores - 1).
    maxWorkers: 2,
    testTimeout: 30_000,
    hookTimeout: 120_000,
    globalSetup: ['tests/setup/global.ts'],
  },
});
