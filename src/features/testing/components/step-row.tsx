import { useRef, useState, type Ref } from 'react';
import { Link } from 'react-router';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { CORRECTION_REASON_MIN, type ReadingDto } from '@shared/schemas/readings';
import { readingValueView } from '@shared/domain/typed-reading';
import { formatOhm } from '@shared/domain/units';
import { Button } from '@/components/ui/button';
import { StatusMark } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';
import type { StripStep } from '../api/get-strip';
import { limitText, previewReading, type StepContext } from '../utils/preview';
import { verdictLook } from '../utils/verdict-look';
import { useDates } from '@/lib/date-format';

export interface ReadingInput {
  stepId: string;
  value: string;
  leadNullId?: string | null;
  supersedesId?: string;
  correctionReason?: string;
}
export interface JudgedPreview {
  verdict: ReadingDto['verdict'];
  display: string;
  explanation: string;
}
/** Keeps the reading on the tablet (the page makes its id, once) and sends it when it can. */
type Submit = (input: ReadingInput, preview: JudgedPreview) => Promise<void>;

/** A reading of this step typed on this tablet that the server does not have yet (or that needs the technician). */
export interface QueuedView {
  status: 'waiting' | 'sending' | 'problem' | 'notice';
  display: string;
  verdict: ReadingDto['verdict'] | null;
  title?: string;
}

function conductorsLabel(step: Pick<StripStep, 'testKind' | 'conductors'>) {
  if (step.testKind === 'continuity') return `Line ${step.conductors}`;
  if (step.testKind === 'insulation' || step.testKind === 'loop') return `Lines ${step.conductors.replace('-', '–')}`;
  return '';
}

/** "Continuity · Line A", as the row's label says it. */
export function stepTitle(step: Pick<StripStep, 'testKind' | 'conductors'>) {
  return [TEST_KIND_LABELS[step.testKind], conductorsLabel(step)].filter(Boolean).join(' · ');
}

export function StepRow({
  index,
  step,
  ctx,
  leadNull,
  canWrite,
  faultId,
  highlight,
  retested = false,
  showCaution = true,
  queued,
  inputRef,
  submit,
  onRecorded,
}: {
  index: number;
  step: StripStep;
  ctx: StepContext;
  /** The technician's test-lead null of this session (null: none set). */
  leadNull: { id: string; valueOhm: number } | null;
  canWrite: boolean;
  faultId: string | null;
  highlight: boolean;
  /** Measured again since the repair of its item's fault. */
  retested?: boolean;
  /** The caution of its kind is shown once per item kind, on its first step. */
  showCaution?: boolean;
  queued: QueuedView | null;
  inputRef: Ref<HTMLInputElement>;
  submit: Submit;
  onRecorded: () => void;
}) {
  const [value, setValue] = useState('');
  const { time } = useDates();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [correcting, setCorrecting] = useState(false);
  const [correction, setCorrection] = useState({ value: '', reason: '' });
  const own = useRef<HTMLInputElement | null>(null);

  const preview = previewReading(value, ctx, leadNull?.valueOhm ?? null);
  const limit = limitText(ctx);
  const latest = step.latest;
  const latestView = latest ? readingValueView(latest) : null;
  const fieldId = `reading-${step.id}`;
  const title = stepTitle(step);

  /**
   * A new reading uses this session's null; a correction keeps the null of the reading it
   * corrects (it fixes what was typed, not the measurement).
   */
  async function record(extra: { supersedesId?: string; correctionReason?: string } = {}, typed = value) {
    if (busy) return;
    const lead = extra.supersedesId
      ? latest?.leadNullId
        ? { id: latest.leadNullId, valueOhm: latest.leadOffsetOhm ?? 0 }
        : null
      : leadNull;
    const p = previewReading(typed, ctx, lead?.valueOhm ?? null);
    if (p.state === 'empty') return setError('Type the reading first, or OL for over range.');
    if (p.state === 'invalid') return setError(p.message);
    setBusy(true);
    setError(null);
    try {
      await submit(
        { stepId: step.id, value: typed, ...(lead ? { leadNullId: lead.id } : {}), ...extra },
        { verdict: p.verdict.verdict, display: p.display, explanation: p.verdict.explanation },
      );
      setValue('');
      setCorrecting(false);
      setCorrection({ value: '', reason: '' });
      onRecorded();
    } catch (err) {
      // Only the tablet's own storage can fail here: the network is the outbox's business.
      setError(
        `Could not keep the reading on this tablet: ${err instanceof Error ? err.message : String(err)}. Write it down and try again.`,
      );
    } finally {
      setBusy(false);
    }
  }

  const append = (suffix: string) => {
    setValue((v) => (v.replace(/\s*[kKmM]$/, '') + suffix).trimStart());
    own.current?.focus();
  };
  const showFault = latest?.faultId ?? faultId;

  return (
    <li
      className={`grid gap-3 border-b border-line px-4 py-4 last:border-0 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.15fr)] ${highlight ? 'bg-brass-soft/60' : ''}`}
      data-step={`${step.testKind} ${step.conductors}`}
      data-retested={retested ? 'yes' : undefined}
    >
      <div className="min-w-0">
        <div className="flex items-baseline gap-2">
          <span className="text-xs font-semibold text-ink-soft tabular-nums">{index}.</span>
          <label htmlFor={fieldId} className="text-base font-semibold">
            {title}
          </label>
          {!step.required && <span className="text-xs text-ink-soft">(optional)</span>}
          {retested && (
            <span
              data-testid="retested"
              className="rounded-full border border-brand/40 bg-brand-soft px-2 text-xs font-semibold text-brand"
            >
              Retested after the repair
            </span>
          )}
        </div>
        <p className="mt-1 text-sm text-ink">{step.instruction}</p>
        {limit && (
          <p className="mt-1 text-xs text-ink-soft">
            Limit: <strong className="text-ink">{limit.text}</strong> — {limit.source}
          </p>
        )}
        {showCaution && step.testKind === 'insulation' && (
          <p className="mt-2 rounded-md border border-brass/50 bg-brass-soft px-2 py-1 text-xs">
            <strong>Caution:</strong> use the multimeter’s resistance range. Never use a high-voltage insulation tester on a cable still
            connected to a scoring apparatus or any electronics.
          </p>
        )}
        {showCaution && step.testKind === 'piste-earth' && (
          <p className="mt-2 rounded-md border border-brass/50 bg-brass-soft px-2 py-1 text-xs">
            <strong>Note:</strong> this checks the piste’s link to the apparatus earth only. The hall’s own earthing and mains installation
            are the business of a licensed electrician under local codes.
          </p>
        )}
        {queued && <QueuedLine queued={queued} />}
        {latest && (
          <div className="mt-2 flex flex-wrap items-center gap-2 text-sm" data-testid="latest">
            <span className="text-ink-soft">Latest:</span>
            <strong className="tabular-nums">{latestView!.value}</strong>
            {latestView!.typed && (
              <span className="text-xs tabular-nums text-ink-soft" data-testid="latest-typed">
                typed {latestView!.typed} − {latestView!.leadNull} lead null
              </span>
            )}
            <StatusMark {...verdictLook[latest.verdict]} size="sm" />
            <span className="text-xs text-ink-soft">
              {latest.takenByName ?? 'someone'}, {time(latest.takenAt)} · profile v{latest.profileVersion}
              {latest.correctionReason ? ` · corrected: ${latest.correctionReason}` : ''}
            </span>
            {canWrite && !correcting && (
              <button
                type="button"
                className="min-h-touch px-1 text-xs font-medium text-brand underline"
                onClick={() => setCorrecting(true)}
              >
                Correct this reading
              </button>
            )}
          </div>
        )}
      </div>

      <div className="min-w-0">
        {canWrite ? (
          <form
            className="flex flex-wrap items-center gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              void record();
            }}
          >
            <input
              id={fieldId}
              ref={(el) => {
                own.current = el;
                if (typeof inputRef === 'function') inputRef(el);
              }}
              inputMode="decimal"
              autoComplete="off"
              enterKeyHint="next"
              spellCheck={false}
              placeholder={step.testKind === 'insulation' ? 'OL' : 'Ω'}
              value={value}
              onChange={(e) => {
                setValue(e.target.value);
                setError(null);
              }}
              aria-describedby={`${fieldId}-preview`}
              aria-invalid={preview.state === 'invalid' || !!error ? true : undefined}
              className="min-h-touch w-36 rounded-lg border-2 border-line bg-card px-3 text-lg font-semibold tabular-nums focus:border-brand aria-[invalid=true]:border-fail"
            />
            <button
              type="button"
              tabIndex={-1}
              className="min-h-touch min-w-touch rounded-lg border border-line bg-paper px-3 font-semibold"
              onClick={() => {
                setValue('OL');
                own.current?.focus();
              }}
            >
              OL
            </button>
            <button
              type="button"
              tabIndex={-1}
              className="min-h-touch min-w-touch rounded-lg border border-line bg-paper px-3 font-semibold"
              onClick={() => append('k')}
            >
              k
            </button>
            <button
              type="button"
              tabIndex={-1}
              className="min-h-touch min-w-touch rounded-lg border border-line bg-paper px-3 font-semibold"
              onClick={() => append('M')}
            >
              M
            </button>
            <Button type="submit" disabled={busy}>
              {busy ? 'Keeping…' : latest || queued ? 'Record again' : 'Record'}
            </Button>
          </form>
        ) : (
          <p className="text-sm text-ink-soft">Read only: only the assigned technicians and the technical director record readings.</p>
        )}
        <div id={`${fieldId}-preview`} aria-live="polite" className="mt-2 text-sm">
          {preview.state === 'judged' && (
            <p className="flex flex-wrap items-start gap-2">
              <StatusMark {...verdictLook[preview.verdict.verdict]} />
              <span>
                <strong>{preview.display}</strong>
                {leadNull && leadNull.valueOhm > 0 && preview.display !== 'OL'
                  ? ` (less the ${formatOhm(leadNull.valueOhm)} lead null)`
                  : ''}{' '}
                — {preview.verdict.explanation}
              </span>
            </p>
          )}
          {preview.state === 'invalid' && <p className="text-fail">{preview.message}</p>}
          {error && (
            <p role="alert" className="font-medium text-fail">
              {error}
            </p>
          )}
          {preview.state === 'empty' && !error && latest && latest.verdict !== 'pass' && (
            <p className="flex flex-wrap items-start gap-2">
              <StatusMark {...verdictLook[latest.verdict]} size="sm" />
              <span>{latest.explanation}</span>
            </p>
          )}
        </div>
        {showFault && (
          <p className="mt-2 flex flex-wrap items-center gap-2 rounded-md border border-fail/40 bg-fail-soft px-3 py-2 text-sm">
            <StatusMark shape="triangle" tone="fail" label="Fault recorded" size="sm" />
            <Link to={paths.fault(showFault)} className="inline-flex min-h-touch items-center font-semibold text-fail underline">
              Locate and repair this fault
            </Link>
          </p>
        )}
        {correcting && latest && (
          <form
            className="mt-3 flex flex-wrap items-end gap-2 rounded-lg border border-line bg-paper p-3"
            onSubmit={(e) => {
              e.preventDefault();
              if (correction.reason.trim().length < CORRECTION_REASON_MIN) {
                return setError(
                  `Say what was wrong in at least ${CORRECTION_REASON_MIN} characters, e.g. “typed 3.4 for 0.34”. A correction does not close a fault.`,
                );
              }
              void record({ supersedesId: latest.id, correctionReason: correction.reason.trim() }, correction.value);
            }}
          >
            <label className="flex flex-col text-xs font-medium">
              Corrected value
              <input
                inputMode="decimal"
                className="min-h-touch w-32 rounded-lg border border-line bg-card px-2 text-base"
                value={correction.value}
                onChange={(e) => setCorrection((c) => ({ ...c, value: e.target.value }))}
              />
            </label>
            <label className="flex min-w-48 flex-1 flex-col text-xs font-medium">
              Why (kept with the reading)
              <input
                className="min-h-touch rounded-lg border border-line bg-card px-2 text-base"
                value={correction.reason}
                onChange={(e) => setCorrection((c) => ({ ...c, reason: e.target.value }))}
              />
            </label>
            <Button type="submit" variant="secondary">
              Save correction
            </Button>
            <Button variant="ghost" onClick={() => setCorrecting(false)}>
              Cancel
            </Button>
          </form>
        )}
      </div>
    </li>
  );
}

function QueuedLine({ queued }: { queued: QueuedView }) {
  if (queued.status === 'problem' || queued.status === 'notice') {
    const notice = queued.status === 'notice';
    return (
      <div
        data-testid="queued"
        data-status={queued.status}
        className={`mt-2 flex flex-wrap items-center gap-2 rounded-md border-2 px-2 py-1 text-sm ${notice ? 'border-brass bg-brass-soft' : 'border-fail/50 bg-fail-soft'}`}
      >
        <StatusMark
          shape="octagon"
          tone={notice ? 'brass' : 'fail'}
          label={notice ? 'Recorded — read this' : 'Not recorded — needs you'}
          size="sm"
        />
        <strong className="tabular-nums">{queued.display}</strong>
        <span>{queued.title}</span>
        <Link to={paths.onThisTablet} className="inline-flex min-h-touch items-center font-medium text-brand underline">
          See what to do
        </Link>
      </div>
    );
  }
  return (
    <div
      data-testid="queued"
      data-status={queued.status}
      className="mt-2 flex flex-wrap items-center gap-2 rounded-md border border-dashed border-ink-soft/50 bg-paper px-2 py-1 text-sm"
    >
      <StatusMark shape="hourglass" tone="idle" label={queued.status === 'sending' ? 'Sending…' : 'Waiting to send'} size="sm" />
      <strong className="tabular-nums">{queued.display}</strong>
      {queued.verdict && <StatusMark {...verdictLook[queued.verdict]} size="sm" />}
      <span className="text-xs text-ink-soft">
        verdict from this tablet; kept here until the server has it{queued.verdict === 'fail' ? ' (a fault is opened when it arrives)' : ''}
      </span>
    </div>
  );
}
