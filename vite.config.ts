import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vite';

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
  build: { outDir: 'dist/client', sourcemap: true },
  test: {
    // see tests/README in DEVELOPERS.md: projects split engine (pure), server (real PostgreSQL), e2e (Chromium)
  },
});
