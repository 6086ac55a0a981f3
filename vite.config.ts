import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { VitePWA } from 'vite-plugin-pwa';
import { compression } from 'vite-plugin-compression2';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const appVersion = (JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8')) as { version: string }).version;

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // The app shell and every built asset (fonts too) are precached, so the testing screen opens and
    // reloads without a network once opened online. The API is never cached by the worker: its data
    // is kept by TanStack Query's persister and the readings outbox (src/features/offline).
    VitePWA({
      registerType: 'autoUpdate',
      injectRegister: false,
      includeAssets: ['favicon.svg', 'icon-192.png', 'icon-512.png'],
      manifest: {
        name: 'Stripwarden',
        short_name: 'Stripwarden',
        description: 'Venue electrical checks for fencing competitions.',
        theme_color: '#0f3d3e',
        background_color: '#f7f5f0',
        display: 'standalone',
        orientation: 'any',
        start_url: '/',
        scope: '/',
        icons: [
          { src: '/favicon.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' },
          { src: '/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: '/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
        ],
      },
      workbox: {
        // wasm: the label scanner's QR reader, so scanning works offline too.
        globPatterns: ['**/*.{js,css,html,svg,png,woff2,wasm}'],
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//, /^\/\.well-known\//],
        cleanupOutdatedCaches: true,
        clientsClaim: true,
        skipWaiting: true,
      },
    }),
    // Brotli and gzip copies of every text asset, made once at build time at the highest levels, so
    // the server sends a hall's slow Wi-Fi a fraction of the bytes without compressing per request
    // (served by express-static-gzip in server/http/static-files.ts).
    compression({ algorithms: ['brotliCompress', 'gzip'], include: /\.(html|css|js|mjs|json|svg|webmanifest|txt|wasm)$/, threshold: 1024 }),
  ],
  define: { __APP_VERSION__: JSON.stringify(appVersion) },
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
    // Bounds for a loaded two-core machine (a sign-off renders and signs five PDFs), never waits.
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
