/// <reference types="vitest/config" />
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vite';

// The API listens on 127.0.0.1:3001 in development. The proxy keeps the
// browser's Host header (changeOrigin: false) so the API's Origin check sees
// the same origin the page was loaded from.
const apiProxy = {
  '/api': { target: 'http://127.0.0.1:3001', changeOrigin: false },
};

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: { host: '127.0.0.1', port: 5173, proxy: apiProxy },
  preview: { host: '127.0.0.1', port: 4173, proxy: apiProxy },
  // the manifest feeds the bundle budget check (infra/bundle-budget.mjs)
  build: { outDir: 'dist', emptyOutDir: true, manifest: true },
  test: {
    environment: 'jsdom',
    include: ['src/**/*.test.{ts,tsx}'],
    setupFiles: ['src/test/setup.ts'],
    css: false,
  },
});
