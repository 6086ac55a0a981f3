import { createAsyncStoragePersister } from '@tanstack/query-async-storage-persister';
import { del, get, set } from 'idb-keyval';

const KEY = 'stripwarden.query-cache';

// The saved copy is read as soon as this module runs, while the rest of the app's code is still
// being evaluated: the provider asks for it only after its first render, and until it has it, no
// screen shows (opening IndexedDB takes a few hundred milliseconds on a slow tablet).
let early: Promise<string | undefined> | null = typeof indexedDB === 'undefined' ? null : get<string>(KEY).catch(() => undefined);

const storage = {
  getItem: async (key: string) => {
    const first = key === KEY ? early : null;
    early = null;
    return ((await (first ?? get<string>(key))) as string | undefined) ?? null;
  },
  setItem: (key: string, value: string) => set(key, value),
  removeItem: (key: string) => del(key),
};

/** TanStack Query's cache snapshot, in IndexedDB (idb-keyval's default store) rather than localStorage's 5 MB. */
export const queryPersister = createAsyncStoragePersister({ key: KEY, storage, throttleTime: 1_000 });

/** The same copy, written when asked rather than at most once a second (the outbox waits for it). */
export const queryPersisterNow = createAsyncStoragePersister({ key: KEY, storage, throttleTime: 0 });
