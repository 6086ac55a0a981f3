// Whether a venue can be signed off, strip by strip: every required active step has a latest
// reading that passes (near limit passes and is listed), no fault is open, or the strip is
// withdrawn with a reason (before or at sign-off). Pure: the caller gathers the rows.
import { stripStatus, type StripStatus, type Verdict } from './progress';

export interface ReadinessReading {
  readingId: string;
  verdict: Verdict;
  valueText: string;
  valueOhm: number | null;
  overRange: boolean;
  limitOhm: number | null;
  limitKind: 'max' | 'min' | null;
  source: string;
  /** The item the reading was taken on, when known. */
  equipmentId: string | null;
  takenAt: string;
  takenByName: string;
}

export interface ReadinessStep {
  stepId: string;
  positionId: string;
  positionName: string;
  /** The item in the position now. */
  equipmentId: string | null;
  assetTag: string | null;
  testKind: string;
  conductors: string;
  required: boolean;
  latest: ReadinessReading | null;
}

export interface ReadinessFault {
  faultId: string;
  positionName: string;
  kind: string;
  conductors: string;
  status: string;
}

export interface ReadinessStripInput {
  stripId: string;
  label: string;
  withdrawnReason: string | null;
  withdrawn: boolean;
  steps: ReadinessStep[];
  openFaults: ReadinessFault[];
}

export interface ExceptionInput {
  stripId: string;
  reason: string;
}

export interface StepRef {
  stripId: string;
  stripLabel: string;
  stepId: string;
  positionId: string;
  positionName: string;
  assetTag: string | null;
  testKind: string;
  conductors: string;
}

export interface FailingStep extends StepRef {
  readingId: string;
  valueText: string;
  valueOhm: number | null;
  limitOhm: number | null;
  limitKind: 'max' | 'min' | null;
  source: string;
  takenAt: string;
}

export type MissingWhy = 'no-reading' | 'item-swapped';
export interface MissingStep extends StepRef {
  why: MissingWhy;
}

export type StripReadinessState = 'ready' | 'withdrawn' | 'exception' | 'missing' | 'failing' | 'no-steps';

export interface StripReadiness {
  stripId: string;
  label: string;
  state: StripReadinessState;
  status: StripStatus;
  /** Why the strip is left out of this sign-off (withdrawn before, or an exception now). */
  exceptionReason: string | null;
  requiredSteps: number;
  passedSteps: number;
  missing: MissingStep[];
  failing: FailingStep[];
  openFaults: ReadinessFault[];
  nearLimit: FailingStep[];
}

export type ReadinessIssue =
  | ({ kind: 'missing' } & MissingStep)
  | ({ kind: 'failing' } & FailingStep)
  | ({ kind: 'open-fault'; stripId: string; stripLabel: string; faultKind: string } & Omit<ReadinessFault, 'kind'>)
  | { kind: 'no-steps'; stripId: string; stripLabel: string }
  | { kind: 'nothing-to-certify' };

export interface VenueReadiness {
  ready: boolean;
  strips: StripReadiness[];
  nearLimit: FailingStep[];
  exceptions: { stripId: string; label: string; reason: string; source: 'withdrawn' | 'sign-off' }[];
  issues: ReadinessIssue[];
  counts: { strips: number; ready: number; excepted: number; notReady: number };
}

function ref(strip: ReadinessStripInput, s: ReadinessStep): StepRef {
  return {
    stripId: strip.stripId,
    stripLabel: strip.label,
    stepId: s.stepId,
    positionId: s.positionId,
    positionName: s.positionName,
    assetTag: s.assetTag,
    testKind: s.testKind,
    conductors: s.conductors,
  };
}

function withReading(strip: ReadinessStripInput, s: ReadinessStep, r: ReadinessReading): FailingStep {
  return {
    ...ref(strip, s),
    readingId: r.readingId,
    valueText: r.valueText,
    valueOhm: r.valueOhm,
    limitOhm: r.limitOhm,
    limitKind: r.limitKind,
    source: r.source,
    takenAt: r.takenAt,
  };
}

/** A reading counts for a step only when it was taken on the item that is in the position now. */
export function readingCounts(s: ReadinessStep): boolean {
  if (!s.latest) return false;
  return !(s.latest.equipmentId && s.equipmentId && s.latest.equipmentId !== s.equipmentId);
}

export function stripReadiness(strip: ReadinessStripInput, exceptionReason?: string): StripReadiness {
  const active = strip.steps.filter((s) => s.required);
  const missing: MissingStep[] = [];
  const failing: FailingStep[] = [];
  const nearLimit: FailingStep[] = [];
  let passed = 0;
  for (const s of active) {
    if (!s.latest) missing.push({ ...ref(strip, s), why: 'no-reading' });
    else if (!readingCounts(s)) missing.push({ ...ref(strip, s), why: 'item-swapped' });
    else if (s.latest.verdict === 'fail') failing.push(withReading(strip, s, s.latest));
    else {
      passed += 1;
      if (s.latest.verdict === 'near-limit') nearLimit.push(withReading(strip, s, s.latest));
    }
  }
  const status = stripStatus({
    withdrawn: strip.withdrawn,
    steps: active.map((s) => ({ required: true, latestVerdict: readingCounts(s) ? s.latest!.verdict : null })),
    openFaults: strip.openFaults.length,
    // Readiness asks whether the tests hold; a suspended strip is amended by exactly this check.
    outOfService: false,
  });
  const excepted = strip.withdrawn ? (strip.withdrawnReason ?? '') : exceptionReason;
  const state: StripReadinessState = strip.withdrawn
    ? 'withdrawn'
    : exceptionReason !== undefined
      ? 'exception'
      : failing.length > 0 || strip.openFaults.length > 0
        ? 'failing'
        : missing.length > 0
          ? 'missing'
          : active.length === 0
            ? 'no-steps'
            : 'ready';
  return {
    stripId: strip.stripId,
    label: strip.label,
    state,
    status,
    exceptionReason: excepted ?? null,
    requiredSteps: active.length,
    passedSteps: passed,
    missing,
    failing,
    openFaults: strip.openFaults,
    nearLimit,
  };
}

/**
 * The whole venue. Exceptions given at sign-off count as withdrawals for this sign-off only; an
 * exception naming an unknown strip is the caller's input error, so it is reported, not ignored.
 */
export function venueReadiness(strips: ReadinessStripInput[], exceptions: ExceptionInput[] = []): VenueReadiness {
  const given = new Map(exceptions.map((e) => [e.stripId, e.reason.trim()]));
  const result = strips.map((s) => stripReadiness(s, given.get(s.stripId)));
  const issues: ReadinessIssue[] = [];
  for (const s of result) {
    if (s.state === 'withdrawn' || s.state === 'exception') continue;
    for (const m of s.missing) issues.push({ kind: 'missing', ...m });
    for (const f of s.failing) issues.push({ kind: 'failing', ...f });
    for (const { kind: faultKind, ...f } of s.openFaults) {
      issues.push({ kind: 'open-fault', stripId: s.stripId, stripLabel: s.label, faultKind, ...f });
    }
    if (s.state === 'no-steps') issues.push({ kind: 'no-steps', stripId: s.stripId, stripLabel: s.label });
  }
  const certified = result.filter((s) => s.state === 'ready');
  if (certified.length === 0) issues.push({ kind: 'nothing-to-certify' });
  const excepted = result.filter((s) => s.state === 'withdrawn' || s.state === 'exception');
  return {
    ready: issues.length === 0,
    strips: result,
    nearLimit: certified.flatMap((s) => s.nearLimit),
    exceptions: excepted.map((s) => ({
      stripId: s.stripId,
      label: s.label,
      reason: s.exceptionReason ?? '',
      source: s.state === 'withdrawn' ? ('withdrawn' as const) : ('sign-off' as const),
    })),
    issues,
    counts: {
      strips: result.length,
      ready: certified.length,
      excepted: excepted.length,
      notReady: result.length - certified.length - excepted.length,
    },
  };
}

export const READINESS_STATE_LABELS: Record<StripReadinessState, string> = {
  ready: 'Ready',
  withdrawn: 'Withdrawn',
  exception: 'Left out',
  missing: 'Readings missing',
  failing: 'Failing',
  'no-steps': 'No tests planned',
};

/** One plain sentence per issue, for the 409 answer and the sign-off screen. */
export function describeIssue(i: ReadinessIssue): string {
  switch (i.kind) {
    case 'missing':
      return `${i.stripLabel}, ${i.positionName}: ${i.testKind} ${i.conductors} ${i.why === 'item-swapped' ? 'was tested on an item that has since been swapped out' : 'has no reading'}.`;
    case 'failing':
      return `${i.stripLabel}, ${i.positionName}: ${i.testKind} ${i.conductors} fails (${i.valueText}).`;
    case 'open-fault':
      return `${i.stripLabel}, ${i.positionName}: a ${i.faultKind} fault on ${i.conductors} is still ${i.status}.`;
    case 'no-steps':
      return `${i.stripLabel} has no tests planned.`;
    case 'nothing-to-certify':
      return 'No strip is ready to certify.';
  }
}
