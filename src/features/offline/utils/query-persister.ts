import { createAsyncStoragePersister } from '@tanstack/query-async-storage-persister';
import { del, get, set } from 'idb-keyval';

/** TanStack Query's cache snapshot, in IndexedDB (idb-keyval's default store) rather than localStorage's 5 MB. */
export const queryPersister = createAsyncStoragePersister({
  key: 'stripwarden.query-cache',
  storage: {
    getItem: async (key) => (await get<string>(key)) ?? null,
    setItem: (key, value) => set(key, value),
    removeItem: (key) => del(key),
  },
  throttleTime: 1_000,
});
