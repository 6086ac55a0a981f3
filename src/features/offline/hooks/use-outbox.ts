import { useSyncExternalStore } from 'react';
import { outboxStore, type OutboxState } from '../stores/outbox';
import { summarize, type SyncSummary } from '../utils/queue';

export const useOutbox = (): OutboxState => useSyncExternalStore(outboxStore.subscribe, outboxStore.getSnapshot);

export function useSyncSummary(): SyncSummary & { online: boolean; syncing: boolean } {
  const s = useOutbox();
  return {
    ...summarize([...s.items, ...s.incidents], { userId: s.userId, online: s.online, syncing: s.syncing }),
    online: s.online,
    syncing: s.syncing,
  };
}
