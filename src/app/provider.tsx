import type { ReactNode } from 'react';
import { onlineManager } from '@tanstack/react-query';
import { PersistQueryClientProvider, type PersistQueryClientOptions } from '@tanstack/react-query-persist-client';
import { queryClient } from '@/lib/query-client';
import { setUnauthenticatedHandler } from '@/lib/api-client';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { OFFLINE_MAX_AGE_MS, PERSISTED_KEY_PREFIXES, shouldPersistQuery } from '@/features/offline/utils/persist-filter';
import { queryPersister } from '@/features/offline/utils/query-persister';
import { setOutboxHandlers, startOutbox } from '@/features/offline/stores/outbox';
import { readingsRecorded, showRecordedReading } from '@/features/testing/api/show-recorded-reading';

// A 401 anywhere means the session ended: forget who we were, and the guard sends us to sign-in.
setUnauthenticatedHandler(() => queryClient.setQueryData(meQueryOptions().queryKey, null));

// What the testing flow needs is kept on the tablet (IndexedDB) for a week, so it opens without a
// network; it must stay in the memory cache as long, or it would drop out of the saved copy too.
// TanStack Query assumes "online" until an offline event; a page loaded with no network must start paused.
if (typeof navigator !== 'undefined') onlineManager.setOnline(navigator.onLine);
for (const key of PERSISTED_KEY_PREFIXES) queryClient.setQueryDefaults(key, { gcTime: OFFLINE_MAX_AGE_MS });
const persistOptions: Omit<PersistQueryClientOptions, 'queryClient'> = {
  persister: queryPersister,
  maxAge: OFFLINE_MAX_AGE_MS,
  buster: __APP_VERSION__,
  dehydrateOptions: { shouldDehydrateQuery: (q) => q.state.status === 'success' && shouldPersistQuery(q.queryKey, q.state.data) },
};

// Readings typed on the testing screen go through the tablet's outbox; its answers land in the cache.
setOutboxHandlers({
  onRecorded: (reading, item) => showRecordedReading(queryClient, item.stripId, reading),
  onPassDone: ({ stripIds }) => readingsRecorded(queryClient, stripIds),
});
startOutbox();

export function AppProvider({ children }: { children: ReactNode }) {
  return (
    <PersistQueryClientProvider client={queryClient} persistOptions={persistOptions}>
      {children}
    </PersistQueryClientProvider>
  );
}
