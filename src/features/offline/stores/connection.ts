// Can this tablet reach the server? The browser's "offline" is taken at its word; its "online" is
// only a guess. Chromium reports navigator.onLine === true on a page its service worker served
// with no network once the worker had been restarted (and fires no event), and a hall's Wi-Fi with
// no route to the server is "online" too. So the server decides: any answer means online, none
// means offline, and while offline a small request asks again, less often each time.
import { urlOf } from '@/lib/api-client';
import { healthContracts } from '@shared/contracts/health';

const PROBE_URL = urlOf(healthContracts.get);
const PROBE_FIRST_MS = 1_000;
const PROBE_MAX_MS = 5_000;

let online = typeof navigator === 'undefined' ? true : navigator.onLine;
const listeners = new Set<() => void>();
let probeTimer: ReturnType<typeof setTimeout> | undefined;
let probeDelayMs = PROBE_FIRST_MS;
let probing: Promise<boolean> | null = null;
let started = false;

export const connectionStore = {
  subscribe(l: () => void) {
    listeners.add(l);
    return () => listeners.delete(l);
  },
  getSnapshot: () => online,
};

function set(next: boolean) {
  if (next === online) return;
  online = next;
  for (const l of listeners) l();
}

function scheduleProbe() {
  if (online || probeTimer !== undefined) return;
  probeTimer = setTimeout(() => {
    probeTimer = undefined;
    void checkConnection();
  }, probeDelayMs);
  probeDelayMs = Math.min(probeDelayMs * 2, PROBE_MAX_MS);
}

/** The server answered a request (any status): it can be reached. */
export function serverAnswered() {
  // An answer that was on its way when the browser lost its network does not bring it back.
  if (typeof navigator !== 'undefined' && !navigator.onLine) return serverDidNotAnswer();
  clearTimeout(probeTimer);
  probeTimer = undefined;
  probeDelayMs = PROBE_FIRST_MS;
  set(true);
}

/** A request got no answer at all (or the browser knows it has no network). */
export function serverDidNotAnswer() {
  set(false);
  scheduleProbe();
}

/** Asks the server whether it is there (a request the service worker never answers). */
export function checkConnection(): Promise<boolean> {
  if (probing) return probing;
  if (typeof navigator !== 'undefined' && !navigator.onLine) {
    serverDidNotAnswer();
    return Promise.resolve(false);
  }
  probing = fetch(PROBE_URL, { cache: 'no-store', credentials: 'same-origin' })
    .then(
      () => (serverAnswered(), true),
      () => (serverDidNotAnswer(), false),
    )
    .finally(() => {
      probing = null;
    });
  return probing;
}

/** Follows the browser's network events and asks the server at once; once per page. */
export function startConnectionWatch() {
  if (started || typeof window === 'undefined') return;
  started = true;
  window.addEventListener('offline', serverDidNotAnswer);
  window.addEventListener('online', () => {
    probeDelayMs = PROBE_FIRST_MS;
    void checkConnection();
  });
  void checkConnection();
}
