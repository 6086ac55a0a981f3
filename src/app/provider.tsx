import type { ReactNode } from 'react';
import { dehydrate, onlineManager } from '@tanstack/react-query';
import { PersistQueryClientProvider, type PersistQueryClientOptions } from '@tanstack/react-query-persist-client';
import { queryClient } from '@/lib/query-client';
import { setReachabilityObserver, setUnauthenticatedHandler } from '@/lib/api-client';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { OFFLINE_MAX_AGE_MS, PERSISTED_KEY_PREFIXES, shouldPersistQuery } from '@/features/offline/utils/persist-filter';
import { queryPersister, queryPersisterNow } from '@/features/offline/utils/query-persister';
import { setOutboxHandlers, startOutbox } from '@/features/offline/stores/outbox';
import { connectionStore, serverAnswered, serverDidNotAnswer } from '@/features/offline/stores/connection';
import { readingsRecorded, showRecordedReading } from '@/features/testing/api/show-recorded-reading';

// A 401 anywhere means the session ended: forget who we were, and the guard sends us to sign-in.
setUnauthenticatedHandler(() => queryClient.setQueryData(meQueryOptions().queryKey, null));

// What the testing flow needs is kept on the tablet (IndexedDB) for a week, so it opens without a
// network; it must stay in the memory cache as long, or it would drop out of the saved copy too.
// Online means the server answers (see features/offline/stores/connection.ts). Every request tells
// it, and TanStack Query follows it instead of the browser's guess, so queries pause while offline.
setReachabilityObserver((answered) => (answered ? serverAnswered() : serverDidNotAnswer()));
onlineManager.setEventListener((setOnline) => {
  setOnline(connectionStore.getSnapshot());
  return connectionStore.subscribe(() => setOnline(connectionStore.getSnapshot()));
});
for (const key of PERSISTED_KEY_PREFIXES) queryClient.setQueryDefaults(key, { gcTime: OFFLINE_MAX_AGE_MS });
// Structural: the persister's packages come with a query-core of their own (STACK.md's versions).
const keptOnTablet = (q: { queryKey: readonly unknown[]; state: { status: string; data: unknown } }) =>
  q.state.status === 'success' && shouldPersistQuery(q.queryKey, q.state.data);
const persistOptions: Omit<PersistQueryClientOptions, 'queryClient'> = {
  persister: queryPersister,
  maxAge: OFFLINE_MAX_AGE_MS,
  buster: __APP_VERSION__,
  dehydrateOptions: { shouldDehydrateQuery: keptOnTablet },
};

// Readings typed on the testing screen go through the tablet's outbox; its answers land in the cache.
setOutboxHandlers({
  onRecorded: (reading, item) => showRecordedReading(queryClient, item.stripId, reading),
  onPassDone: ({ stripIds }) => {
    readingsRecorded(queryClient, stripIds);
    // A retest ticks off the steps an incident waits for.
    void queryClient.invalidateQueries({ queryKey: ['incidents'] });
  },
  saveCopy: async () =>
    queryPersisterNow.persistClient({
      buster: __APP_VERSION__,
      timestamp: Date.now(),
      clientState: dehydrate(queryClient, { shouldDehydrateQuery: keptOnTablet }),
    }),
});
startOutbox();

export function AppProvider({ children }: { children: ReactNode }) {
  return (
    <PersistQueryClientProvider client={queryClient} persistOptions={persistOptions}>
      {children}
    </PersistQueryClientProvider>
  );
}
