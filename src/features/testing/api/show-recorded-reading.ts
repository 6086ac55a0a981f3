import type { QueryClient } from '@tanstack/react-query';
import type { ReadingDto } from '@shared/schemas/readings';
import { stripQueryOptions, type StripDetail } from './get-strip';

// POST /api/readings itself is sent by the tablet's outbox (features/offline), which keeps the
// reading on disk until the server has it. These put the server's answer where the screen shows it.

/** The stored verdict replaces the browser's preview at once. */
export function showRecordedReading(qc: QueryClient, stripId: string, reading: ReadingDto) {
  qc.setQueryData<StripDetail>(
    stripQueryOptions(stripId).queryKey,
    (old) =>
      old && {
        ...old,
        positions: old.positions.map((p) => ({
          ...p,
          steps: p.steps.map((s) => (s.id === reading.stepId ? { ...s, latest: reading } : s)),
        })),
      },
  );
}

/** After a batch: the strips reload (status, faults opened), and lists and boards elsewhere too. */
export function readingsRecorded(qc: QueryClient, stripIds: string[]) {
  for (const id of stripIds) void qc.invalidateQueries({ queryKey: stripQueryOptions(id).queryKey });
  void qc.invalidateQueries({ queryKey: ['venues'] });
}
