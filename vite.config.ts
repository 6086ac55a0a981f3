import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: {
      '@/': fileURLToPath(new URL('./src/', import.meta.url)),
      '@shared/': fileURLToPath(new URL('./shared/', import.meta.url)),
    },
  },
  build: { outDir: 'dist', emptyOutDir: true, sourcemap: false },
  server: {
    port: 5173,
    // The API runs beside Vite in development (npm run dev).
    proxy: { '/api': 'http://localhost:3000', '/.well-known': 'http://localhost:3000' },
  },
  test: {
    include: ['tests/**/*.test.ts'],
    setupFiles: ['tests/setup/fail-on-console-error.ts'],
    globalSetup: ['tests/setup/global-setup.ts'],
    pool: 'forks',
    testTimeout: 20_000,
    hookTimeout: 30_000,
  },
});
