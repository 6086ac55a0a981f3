// The built client: precompressed copies (brotli, gzip) made by the Vite build are sent to browsers
// that accept them, hashed files are cached for a year, and what names them is asked for each time.
import type { Express } from 'express';
import expressStaticGzip from 'express-static-gzip';
import { basename, relative, sep } from 'node:path';

/** A year, the longest Cache-Control lifetime caches honour (RFC 9111 §5.2.2.1 and its usual practice). */
export const IMMUTABLE = 'public, max-age=31536000, immutable';

// The service worker and the page that names the hashed assets must be asked for every time, or a
// tablet would keep an old version (web.dev, "Service worker lifecycle").
const REVALIDATE = new Set(['index.html', 'sw.js', 'registerSW.js', 'manifest.webmanifest']);

/**
 * Vite names every file under assets/ by its content hash, and Workbox names its runtime the same
 * way: such a name never holds other bytes, so it may be cached for good.
 */
export function isHashedFile(relPath: string): boolean {
  const p = relPath.split(sep).join('/');
  return p.startsWith('assets/') || /^workbox-[0-9a-f]{8}\.js$/.test(p);
}

export function cacheControlFor(relPath: string): string {
  if (REVALIDATE.has(basename(relPath))) return 'no-cache';
  if (isHashedFile(relPath)) return IMMUTABLE;
  return 'public, max-age=3600';
}

export function serveClient(app: Express, distDir: string) {
  app.use(
    expressStaticGzip(distDir, {
      enableBrotli: true,
      // Brotli first when the browser takes both: about 15 % smaller than gzip for our scripts.
      orderPreference: ['br', 'gzip'],
      index: false,
      serveStatic: {
        index: false,
        setHeaders: (res, file) => {
          // The file sent may be the .br or .gz copy: its rules are those of the original.
          const original = relative(distDir, file).replace(/\.(br|gz)$/, '');
          res.setHeader('Cache-Control', cacheControlFor(original));
        },
      },
    }),
  );
  // Single-page fallback for client routes (Express 5 syntax).
  app.get('/{*splat}', (_req, res) => res.set('Cache-Control', 'no-cache').sendFile('index.html', { root: distDir, cacheControl: false }));
}
