import { registerSW } from 'virtual:pwa-register';

/**
 * The service worker keeps the app shell and its assets on the tablet, so the testing screen opens
 * and reloads without a network. autoUpdate: a new version takes over on the next load.
 * Browsers allow service workers only over HTTPS or on localhost.
 */
export function registerServiceWorker() {
  if (typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  registerSW({ immediate: true });
}
