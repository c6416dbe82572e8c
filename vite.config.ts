import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';
import { HEAVY_CHUNKS } from './scripts/heavy-chunks.ts';

const r = (p: string) => fileURLToPath(new URL(p, import.meta.url));

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: { '@': r('./src'), '@server': r('./server'), '@shared': r('./shared') },
  },
  server: {
    port: 5173,
    host: '127.0.0.1',
    proxy: { '/api': { target: `http://127.0.0.1:${process.env.PORT ?? 4800}`, changeOrigin: false } },
  },
  build: {
    outDir: 'dist/client',
    sourcemap: true,
    // .vite/manifest.json: which chunks each route loads (read by `npm run bench -- client`).
    manifest: true,
    rolldownOptions: {
      output: {
        // The heavy libraries each get their own chunk, loaded only by the code that imports
        // them lazily (charts, the editor, maths typesetting, expression parsing); none may end up
        // in the first page's JS (checked by `npm run bench -- client`).
        // A group takes its modules' dependencies along (which keeps execution order right), so
        // React gets its own group first: otherwise it would follow the editor or vega into their
        // chunks and the first page would load them to get React.
        codeSplitting: {
          groups: [
            { name: 'react', test: /[\\/]node_modules[\\/](?:react|react-dom|scheduler)[\\/]/, priority: 1 },
            ...HEAVY_CHUNKS.map(({ name, test }) => ({ name, test })),
          ],
        },
      },
    },
  },
  test: {
    // Four projects: engine (pure, parallel), client (pure client logic: plot specs, stale checks), server (API against a real PostgreSQL cluster
    // started by the global setup), e2e (the built app driven by Debian's Chromium).
    projects: [
      {
        extends: true,
        test: { name: 'engine', include: ['tests/engine/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        test: { name: 'client', include: ['tests/client/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/server-global-setup.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/e2e-global-setup.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 180_000,
        },
      },
    ],
  },
});
