// Where a strip and a venue stand, from the latest reading of each step and the open faults.
export type Verdict = 'pass' | 'near-limit' | 'fail';
export type StripStatus = 'not-started' | 'in-progress' | 'clear' | 'fault-open' | 'withdrawn' | 'out-of-service';

export interface StepProgress {
  required: boolean;
  latestVerdict: Verdict | null;
}

/** Each step's progress from a strip's positions, as the strip's answer carries them (its latest reading or none). */
export const stepProgressOf = (positions: { steps: { required: boolean; latest: { verdict: Verdict } | null }[] }[]): StepProgress[] =>
  positions.flatMap((p) => p.steps.map((s) => ({ required: s.required, latestVerdict: s.latest?.verdict ?? null })));

/** A strip row's own marks that decide its status beside its steps: every answer reads them alike. */
export const stripFlags = (strip: { withdrawnAt: string | null; outOfServiceSince: string | null }) => ({
  withdrawn: !!strip.withdrawnAt,
  outOfService: !!strip.outOfServiceSince,
});

// outOfService is required: an answer that leaves it out would call a suspended strip "clear".
export function stripStatus(s: { withdrawn: boolean; steps: StepProgress[]; openFaults: number; outOfService: boolean }): StripStatus {
  if (s.withdrawn) return 'withdrawn';
  // Suspended after sign-off (an incident or a change on the strip) until the director amends it.
  if (s.outOfService) return 'out-of-service';
  const required = s.steps.filter((x) => x.required);
  const done = required.filter((x) => x.latestVerdict !== null);
  // A failing latest reading counts as an open fault even before a fault record is made.
  if (s.openFaults > 0 || required.some((x) => x.latestVerdict === 'fail')) return 'fault-open';
  if (done.length === 0) return 'not-started';
  return done.length === required.length ? 'clear' : 'in-progress';
}

export function stepCounts(steps: StepProgress[]) {
  const required = steps.filter((x) => x.required);
  return {
    total: required.length,
    done: required.filter((x) => x.latestVerdict !== null).length,
    passed: required.filter((x) => x.latestVerdict === 'pass' || x.latestVerdict === 'near-limit').length,
    nearLimit: required.filter((x) => x.latestVerdict === 'near-limit').length,
    failed: required.filter((x) => x.latestVerdict === 'fail').length,
  };
}

export const STRIP_STATUS_LABELS: Record<StripStatus, string> = {
  'not-started': 'Not started',
  'in-progress': 'In progress',
  clear: 'Clear',
  'fault-open': 'Fault open',
  withdrawn: 'Withdrawn',
  'out-of-service': 'Out of service',
};
