import type { QueryClient } from '@tanstack/react-query';
import type { ReadingDto } from '@shared/schemas/readings';
import { stepCounts, stepProgressOf, stripStatus } from '@shared/domain/progress';
import { stripQueryOptions, type StripDetail } from './get-strip';

// POST /api/readings itself is sent by the tablet's outbox (features/offline), which keeps the
// reading on disk until the server has it. These put the server's answer where the screen shows it.

/**
 * The strip as the tablet knows it once the server has this reading: the stored verdict replaces
 * the browser's preview, and the strip's status and counts are worked out again the server's way
 * (shared/domain/progress.ts). A saved copy read back offline would otherwise say "Not started"
 * beside "1 of 28 measured" until the next answer from the server.
 */
export function withRecordedReading(old: StripDetail, reading: ReadingDto): StripDetail {
  const positions = old.positions.map((p) => ({
    ...p,
    steps: p.steps.map((s) => (s.id === reading.stepId ? { ...s, latest: reading } : s)),
  }));
  // Withdrawn and out of service are the strip's own marks, not its readings; a reading that
  // landed on a signed-off venue suspends the strip (the server says so in its answer).
  const withdrawn = old.status === 'withdrawn';
  const outOfService = old.status === 'out-of-service' || !!reading.stripSuspended;
  const steps = stepProgressOf(positions);
  return {
    ...old,
    positions,
    status: stripStatus({ withdrawn, outOfService, steps, openFaults: old.openFaults.length }),
    counts: stepCounts(steps),
  };
}

export function showRecordedReading(qc: QueryClient, stripId: string, reading: ReadingDto) {
  qc.setQueryData<StripDetail>(stripQueryOptions(stripId).queryKey, (old) => old && withRecordedReading(old, reading));
}

/** After a batch: the strips reload (status, faults opened), and lists and boards elsewhere too. */
export function readingsRecorded(qc: QueryClient, stripIds: string[]) {
  for (const id of stripIds) void qc.invalidateQueries({ queryKey: stripQueryOptions(id).queryKey });
  void qc.invalidateQueries({ queryKey: ['venues'] });
}
