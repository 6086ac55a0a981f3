import { Link } from 'react-router';
import { FAULT_SYMBOLS, READING_SYMBOLS } from '@shared/domain/symbols';
import { paths } from '@/config/paths';
import { READINESS_STATE_LABELS, type StripReadiness, type StripReadinessState } from '@shared/domain/readiness';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { formatOhm } from '@shared/domain/units';

const testLabel = (kind: string) => TEST_KIND_LABELS[kind as keyof typeof TEST_KIND_LABELS] ?? kind;
const wires = (c: string) => (c.startsWith('piste') ? '' : ` ${c}`);

const TONE: Record<StripReadinessState | 'left-out', string> = {
  ready: 'bg-pass-soft text-pass',
  withdrawn: 'bg-idle-soft text-idle',
  exception: 'bg-idle-soft text-idle',
  'left-out': 'bg-idle-soft text-idle',
  missing: 'bg-near-soft text-near',
  failing: 'bg-fail-soft text-fail',
  'no-steps': 'bg-near-soft text-near',
};

function StateShape({ state }: { state: StripReadinessState | 'left-out' }) {
  const common = {
    'aria-hidden': true,
    viewBox: '0 0 20 20',
    className: 'size-4',
    fill: 'none',
    stroke: 'currentColor',
    strokeWidth: 2.4,
    strokeLinecap: 'round' as const,
  };
  if (state === 'ready')
    return (
      <svg {...common}>
        <path d="M4 10.5l4 4 8-9" />
      </svg>
    );
  if (state === 'failing')
    return (
      <svg {...common}>
        <path d="M5 5l10 10M15 5L5 15" />
      </svg>
    );
  if (state === 'missing' || state === 'no-steps')
    return (
      <svg {...common}>
        <circle cx="10" cy="10" r="7" />
      </svg>
    );
  return (
    <svg {...common}>
      <path d="M4 10h12" />
    </svg>
  );
}

export function StateBadge({ state }: { state: StripReadinessState | 'left-out' }) {
  const label = state === 'left-out' ? 'Left out' : READINESS_STATE_LABELS[state];
  return (
    <span className={`inline-flex items-center gap-1.5 rounded-full px-2.5 py-0.5 text-sm font-medium ${TONE[state]}`}>
      <StateShape state={state} />
      {label}
    </span>
  );
}

/** Strip by strip: what is missing or failing, each with a link to where it is fixed. */
export function ReadinessList({
  strips,
  leftOut,
  onLeaveOut,
}: {
  strips: StripReadiness[];
  leftOut: Set<string>;
  onLeaveOut?: (stripId: string) => void;
}) {
  return (
    <ul className="divide-y divide-line">
      {strips.map((s) => {
        const state = leftOut.has(s.stripId) && s.state !== 'withdrawn' ? 'left-out' : s.state;
        const blocking = state === 'missing' || state === 'failing' || state === 'no-steps';
        return (
          <li key={s.stripId} className="py-3" data-testid={`readiness-${s.label}`}>
            <div className="flex flex-wrap items-center gap-3">
              <Link to={paths.stripTest(s.stripId)} className="min-w-24 font-semibold text-ink underline-offset-2 hover:underline">
                {s.label}
              </Link>
              <StateBadge state={state} />
              <span className="text-sm text-ink-soft">
                {s.passedSteps} of {s.requiredSteps} tests passed
                {s.nearLimit.length > 0 && `, ${s.nearLimit.length} near limit`}
              </span>
              {blocking && onLeaveOut && (
                <button
                  type="button"
                  className="ml-auto min-h-touch rounded-lg px-3 text-sm font-medium text-brand hover:bg-brand-soft"
                  onClick={() => onLeaveOut(s.stripId)}
                >
                  Leave this strip out…
                </button>
              )}
            </div>
            {s.state === 'withdrawn' && <p className="mt-1 text-sm text-ink-soft">Withdrawn: {s.exceptionReason}</p>}
            {state !== 'left-out' && (s.failing.length > 0 || s.missing.length > 0 || s.openFaults.length > 0) && (
              <ul className="mt-2 flex flex-col gap-1 text-sm">
                {s.failing.map((f) => (
                  <li key={f.stepId}>
                    <Link to={paths.stripTest(s.stripId)} className="inline-flex min-h-touch items-center gap-2 text-fail underline">
                      {READING_SYMBOLS.fail.glyph} {f.positionName} · {testLabel(f.testKind)}
                      {wires(f.conductors)}: {f.valueText}
                      {f.limitOhm !== null && ` (limit ${f.limitKind === 'min' ? 'min' : 'max'} ${formatOhm(f.limitOhm)})`}
                    </Link>
                  </li>
                ))}
                {s.openFaults.map((f) => (
                  <li key={f.faultId}>
                    <Link to={paths.fault(f.faultId)} className="inline-flex min-h-touch items-center gap-2 text-fail underline">
                      {FAULT_SYMBOLS.open.glyph} {f.positionName}: {f.kind} fault on {f.conductors}, still {f.status}
                    </Link>
                  </li>
                ))}
                {s.missing.length > 0 && (
                  <li>
                    <Link to={paths.stripTest(s.stripId)} className="inline-flex min-h-touch items-center gap-2 text-near underline">
                      {READING_SYMBOLS['not-measured'].glyph} {s.missing.length} {s.missing.length === 1 ? 'test' : 'tests'} without a
                      reading
                      {s.missing.some((m) => m.why === 'item-swapped') && ' (some items were swapped after testing)'}:{' '}
                      {s.missing
                        .slice(0, 4)
                        .map((m) => `${m.positionName} ${testLabel(m.testKind).toLowerCase()}${wires(m.conductors)}`)
                        .join(', ')}
                      {s.missing.length > 4 && '…'}
                    </Link>
                  </li>
                )}
              </ul>
            )}
          </li>
        );
      })}
    </ul>
  );
}
