/**
 * The service worker keeps the app shell and its assets on the tablet, so the testing screen opens
 * and reloads without a network. Registered with the browser's own API (workbox-window would add
 * its weight to every first screen for two lines of it). The worker takes over at once
 * (skipWaiting, clientsClaim in vite.config.ts); when a new version replaces an old one, the page
 * reloads so it never asks for chunks the old build had. Typed readings are in IndexedDB by then.
 * Browsers allow service workers only over HTTPS or on localhost.
 */
export function registerServiceWorker() {
  if (!import.meta.env.PROD || typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  const replacing = !!navigator.serviceWorker.controller;
  navigator.serviceWorker.addEventListener('controllerchange', () => {
    if (replacing) window.location.reload();
  });
  navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch((err: unknown) => {
    // Without it the app still works online; only the offline reload is lost.
    console.warn('The service worker could not be registered:', err);
  });
}
