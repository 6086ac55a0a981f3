import { useCallback, useEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import { Link } from 'react-router';
import type { LimitProfile } from '@shared/domain/limits';
import { READING_SYMBOLS, verdictSymbol } from '@shared/domain/symbols';
import { MarkIcon, StatusMark } from '@/components/ui/status-mark';
import { Button } from '@/components/ui/button';
import { paths } from '@/config/paths';
import type { StripFault, StripPosition, StripStep } from '../api/get-strip';
import { cellKey, gridColumns } from '../utils/grid-columns';
import { limitText, previewReading, type StepContext } from '../utils/preview';
import { stepTitle, type JudgedPreview, type QueuedView, type ReadingInput } from './step-row';
import { Keypad, type PadKey } from './keypad';

export type GridSubmit = (position: StripPosition, step: StripStep, input: ReadingInput, preview: JudgedPreview) => Promise<void>;

const CONFIRM = 'inline-flex min-h-14 items-center justify-center rounded-lg bg-brand px-4 font-semibold text-white';

interface Cell {
  position: StripPosition;
  step: StripStep;
  ctx: StepContext;
}

/**
 * The whole strip on one screen: a row per item, a column per measurement, each cell typed on the
 * keyboard or the keypad beside it. Enter records and moves to the next cell not yet measured;
 * O (or the OL key) records over range at once; A (or its key) records OL on all of an item's
 * insulation pairs after one confirmation. It records through the same path as the step list.
 */
export function EntryGrid({
  positions,
  profile,
  leadNull,
  canWrite,
  faults,
  queued,
  retest,
  ready,
  focusRequest,
  nextStripId,
  boardHref,
  limitsName,
  submit,
}: {
  limitsName: string;
  positions: StripPosition[];
  profile: LimitProfile;
  /** The person's test-lead null of this session: subtracted from each reading, its id sent with it. */
  leadNull: { id: string; valueOhm: number } | null;
  canWrite: boolean;
  faults: StripFault[];
  queued: Map<string, QueuedView>;
  /** The item being retested after a repair, and since when its readings count as the retest. */
  retest: { positionId: string; since: string | null } | null;
  ready: boolean;
  /** Bumped by the page to send focus back to the grid (after the lead null, for instance). */
  focusRequest: number;
  nextStripId: string | null;
  boardHref: string;
  submit: GridSubmit;
}) {
  const rows = positions.filter((p) => p.steps.length > 0);
  const nothing = positions.filter((p) => p.steps.length === 0);
  const columns = useMemo(() => gridColumns(positions.flatMap((p) => p.steps)), [positions]);
  const cells = useMemo<Cell[]>(
    () =>
      rows.flatMap((position) =>
        columns.flatMap((c) => {
          const step = position.steps.find((s) => cellKey(s) === c.key);
          return step
            ? [
                {
                  position,
                  step,
                  ctx: {
                    profile,
                    equipmentKind: position.equipmentKind,
                    testKind: step.testKind,
                    conductors: step.conductors,
                    lengthM: position.equipment?.lengthM ?? null,
                  },
                },
              ]
            : [];
        }),
      ),
    [rows, columns, profile],
  );
  const [values, setValues] = useState<Record<string, string>>({});
  const [active, setActive] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [again, setAgain] = useState<{ stepId: string; text: string } | null>(null);
  const [allOl, setAllOl] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  // Recorded here but not in `queued` yet (the outbox store answers a moment later).
  const justRecorded = useRef<Set<string>>(new Set());
  const inputs = useRef<Map<string, HTMLInputElement>>(new Map());
  const doneButton = useRef<HTMLAnchorElement>(null);

  const measured = useCallback((s: StripStep) => !!s.latest || queued.has(s.id) || justRecorded.current.has(s.id), [queued]);
  const current = cells.find((c) => c.step.id === active) ?? null;
  const complete = cells.length > 0 && cells.every((c) => measured(c.step));

  const focusCell = useCallback((stepId: string | null | undefined) => {
    if (!stepId) {
      setActive(null);
      requestAnimationFrame(() => doneButton.current?.focus());
      return;
    }
    setActive(stepId);
    requestAnimationFrame(() => inputs.current.get(stepId)?.focus());
  }, []);

  /** Focus without waiting for a frame: keys typed right after Enter must land in the new cell. */
  const focusNow = useCallback((stepId: string | null | undefined) => {
    if (!stepId) {
      setActive(null);
      // The "strip complete" action is rendered once the cells are all measured: wait for it.
      requestAnimationFrame(() => doneButton.current?.focus());
      return;
    }
    setActive(stepId);
    inputs.current.get(stepId)?.focus();
  }, []);

  /** The next cell without a reading after `fromStepId` (wrapping round), or none: the strip is complete. */
  const nextUnmeasured = useCallback(
    (fromStepId?: string) => {
      const at = fromStepId ? cells.findIndex((c) => c.step.id === fromStepId) : -1;
      const order = [...cells.slice(at + 1), ...cells.slice(0, at + 1)];
      return order.find((c) => !measured(c.step))?.step.id ?? null;
    },
    [cells, measured],
  );

  // On arrival, after the safety notice, and whenever the page asks: the retest's first step, else
  // the first cell not measured, else the "strip complete" action.
  useEffect(() => {
    if (!ready || !canWrite) return;
    const retestFirst = retest
      ? cells.find((c) => c.position.id === retest.positionId && !(retest.since && c.step.latest && c.step.latest.takenAt >= retest.since))
          ?.step.id
      : undefined;
    focusCell(retestFirst ?? nextUnmeasured());
    // Only on these signals, not on every reading recorded (that moves focus itself).
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [ready, canWrite, focusRequest]);

  /** Checks the typed value; a measured step asks once ("record again?"). Null when it can be kept. */
  function check(cell: Cell, text: string, confirmed: boolean): JudgedPreview | null {
    const p = previewReading(text, cell.ctx, leadNull?.valueOhm ?? null);
    if (p.state === 'empty') {
      setError('Type the reading first, or O for over range (OL).');
      return null;
    }
    if (p.state === 'invalid') {
      setError(p.message);
      return null;
    }
    if (measured(cell.step) && !confirmed) {
      setAgain({ stepId: cell.step.id, text });
      return null;
    }
    return { verdict: p.verdict.verdict, display: p.display, explanation: p.verdict.explanation };
  }

  async function keep(cell: Cell, text: string, judged: JudgedPreview): Promise<boolean> {
    justRecorded.current.add(cell.step.id);
    setBusy(true);
    try {
      await submit(
        cell.position,
        cell.step,
        { stepId: cell.step.id, value: text, ...(leadNull ? { leadNullId: leadNull.id } : {}) },
        judged,
      );
      setValues((v) => ({ ...v, [cell.step.id]: '' }));
      return true;
    } catch (err) {
      // Only the tablet's own storage can fail here: the network is the outbox's business.
      justRecorded.current.delete(cell.step.id);
      setError(
        `Could not keep the reading on this tablet: ${err instanceof Error ? err.message : String(err)}. Write it down and try again.`,
      );
      focusNow(cell.step.id);
      return false;
    } finally {
      setBusy(false);
    }
  }

  async function recordAndMove(cell: Cell, text: string, confirmed = false) {
    setAgain(null);
    setError(null);
    const judged = check(cell, text, confirmed);
    if (!judged) return;
    // Focus moves at once, before the tablet's storage answers, so the next value typed straight
    // away lands in the next cell.
    justRecorded.current.add(cell.step.id);
    focusNow(nextUnmeasured(cell.step.id));
    await keep(cell, text, judged);
  }

  const insulationOf = (positionId: string) => cells.filter((c) => c.position.id === positionId && c.step.testKind === 'insulation');

  async function recordAllOl(positionId: string) {
    setAllOl(null);
    const targets = insulationOf(positionId);
    const open = targets.filter((c) => !measured(c.step));
    const chosen = open.length > 0 ? open : targets;
    const judged = chosen.map((c) => check(c, 'OL', true));
    if (judged.some((j) => !j)) return;
    for (const c of chosen) justRecorded.current.add(c.step.id);
    focusNow(nextUnmeasured(chosen[chosen.length - 1].step.id));
    for (let i = 0; i < chosen.length; i++) if (!(await keep(chosen[i], 'OL', judged[i]!))) return;
  }

  function askAllOl(positionId: string) {
    if (insulationOf(positionId).length === 0) return;
    setAgain(null);
    setAllOl(positionId);
  }

  function move(cell: Cell, dRow: number, dCol: number) {
    const r = rows.findIndex((p) => p.id === cell.position.id);
    const c = columns.findIndex((col) => col.key === cellKey(cell.step));
    for (let k = 1; k < 12; k++) {
      const row = rows[r + dRow * k];
      const col = columns[c + dCol * k];
      if (!row || !col) return;
      const target = row.steps.find((s) => cellKey(s) === col.key);
      if (target) return focusCell(target.id);
    }
  }

  function onKey(e: KeyboardEvent<HTMLInputElement>, cell: Cell) {
    const text = values[cell.step.id] ?? '';
    if (e.key === 'Enter') {
      e.preventDefault();
      void recordAndMove(cell, text);
    } else if ((e.key === 'o' || e.key === 'O') && text.trim() === '') {
      // Over range is one key, and records.
      e.preventDefault();
      void recordAndMove(cell, 'OL');
    } else if ((e.key === 'a' || e.key === 'A') && text.trim() === '') {
      e.preventDefault();
      askAllOl(cell.position.id);
    } else if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
      e.preventDefault();
      move(cell, e.key === 'ArrowDown' ? 1 : -1, 0);
    } else if ((e.key === 'ArrowRight' || e.key === 'ArrowLeft') && text === '') {
      e.preventDefault();
      move(cell, 0, e.key === 'ArrowRight' ? 1 : -1);
    } else if (e.key === 'Escape') {
      setAgain(null);
      setAllOl(null);
      setError(null);
    }
  }

  function onPad(key: PadKey) {
    if (!current) return;
    const id = current.step.id;
    const text = values[id] ?? '';
    setError(null);
    if (key === 'enter') return void recordAndMove(current, text);
    if (key === 'OL') return void recordAndMove(current, 'OL');
    if (key === 'all-ol') return askAllOl(current.position.id);
    const next = key === 'back' ? text.slice(0, -1) : key === 'k' || key === 'M' ? text.replace(/\s*[kKmM]$/, '') + key : text + key;
    setValues((v) => ({ ...v, [id]: next }));
  }

  const faultOf = (step: StripStep) => step.latest?.faultId ?? faults.find((f) => f.stepId === step.id)?.id ?? null;
  const hasInsulation = cells.some((c) => c.step.testKind === 'insulation');
  const hasPisteEarth = cells.some((c) => c.step.testKind === 'piste-earth');
  const preview = current ? previewReading(values[current.step.id] ?? '', current.ctx, leadNull?.valueOhm ?? null) : null;
  const limit = current ? limitText(current.ctx) : null;
  const currentFault = current ? faultOf(current.step) : null;
  const retested = (c: Cell) =>
    !!retest && retest.positionId === c.position.id && !!retest.since && !!c.step.latest && c.step.latest.takenAt >= retest.since;

  return (
    <div className="flex flex-col gap-3 min-[960px]:flex-row min-[960px]:items-start" data-testid="entry-grid">
      <div className="min-w-0 flex-1">
        {(hasInsulation || hasPisteEarth) && (
          <div
            className="mb-2 flex flex-col gap-1 rounded-md border border-brass/50 bg-brass-soft px-3 py-1.5 text-sm"
            data-testid="grid-cautions"
          >
            {hasInsulation && (
              <p>
                <strong>Insulation:</strong> the multimeter’s resistance range only; never a high-voltage insulation tester on anything
                still connected to an apparatus or electronics.
              </p>
            )}
            {hasPisteEarth && (
              <p>
                <strong>Piste earth:</strong> checks the link to the apparatus earth only; the hall’s earthing and mains are a licensed
                electrician’s, under local codes.
              </p>
            )}
          </div>
        )}
        <div className="overflow-x-auto">
          <table className="w-full border-separate border-spacing-1 text-sm">
            <thead>
              <tr className="text-xs text-ink-soft">
                <th scope="col" className="text-left font-medium">
                  Item
                </th>
                {columns.map((c, i) => (
                  <th key={c.key} scope="col" className="font-medium leading-tight">
                    {i === 0 || columns[i - 1].group !== c.group ? (
                      <span className="block text-ink">{c.group}</span>
                    ) : (
                      <span className="block">&nbsp;</span>
                    )}
                    {c.short}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {rows.map((position) => (
                <tr
                  key={position.id}
                  data-position={position.name}
                  className={retest?.positionId === position.id ? 'bg-brass-soft/70' : ''}
                >
                  <th scope="row" className="w-28 text-left align-middle text-sm leading-tight font-semibold">
                    {position.name}
                    <span className="block text-xs font-normal text-ink-soft">{position.equipment?.assetTag ?? 'no item'}</span>
                  </th>
                  {columns.map((col) => {
                    const step = position.steps.find((s) => cellKey(s) === col.key);
                    if (!step) return <td key={col.key} aria-hidden className="rounded-md bg-idle-soft/50" />;
                    const cell = cells.find((c) => c.step.id === step.id)!;
                    const q = queued.get(step.id);
                    const shown = q
                      ? { text: q.display, verdict: q.verdict }
                      : step.latest
                        ? { text: step.latest.overRange ? 'OL' : step.latest.valueText, verdict: step.latest.verdict }
                        : null;
                    const look = shown ? verdictSymbol(shown.verdict) : READING_SYMBOLS['not-measured'];
                    const typed = values[step.id] ?? '';
                    const fault = faultOf(step);
                    const isActive = active === step.id;
                    return (
                      <td key={col.key} className="p-0 align-top">
                        <div
                          data-cell={cellKey(step)}
                          data-verdict={shown?.verdict ?? 'not-measured'}
                          data-retested={retested(cell) ? 'yes' : undefined}
                          className={`relative flex h-14 min-w-14 flex-col rounded-md border-2 bg-card ${isActive ? 'border-brand' : shown?.verdict === 'fail' ? 'border-fail' : 'border-line'}`}
                        >
                          <input
                            ref={(el) => {
                              if (el) inputs.current.set(step.id, el);
                              else inputs.current.delete(step.id);
                            }}
                            aria-label={`${position.name} · ${stepTitle(step)}`}
                            aria-describedby={`cell-${step.id}`}
                            readOnly={!canWrite}
                            inputMode="decimal"
                            autoComplete="off"
                            enterKeyHint="next"
                            spellCheck={false}
                            value={typed}
                            onFocus={() => {
                              if (active !== step.id) {
                                setActive(step.id);
                                setAgain(null);
                                setAllOl(null);
                                setError(null);
                              }
                            }}
                            onChange={(e) => {
                              setValues((v) => ({ ...v, [step.id]: e.target.value }));
                              setError(null);
                            }}
                            onKeyDown={(e) => onKey(e, cell)}
                            className="peer h-full w-full min-w-0 rounded-md bg-transparent px-1 text-center text-base font-semibold tabular-nums outline-none"
                          />
                          {typed === '' && (shown || !isActive) && (
                            <span
                              id={`cell-${step.id}`}
                              className="pointer-events-none absolute inset-0 flex items-center justify-center gap-1 px-1 text-sm tabular-nums"
                            >
                              <MarkIcon shape={look.shape} tone={look.tone} className="size-3.5" />
                              <span className={shown ? 'font-semibold' : 'text-ink-soft'}>{shown ? shown.text : ''}</span>
                              <span className="sr-only">{shown ? `${look.label}${q ? ', waiting to send' : ''}` : 'not measured'}</span>
                              {q && <MarkIcon shape="hourglass" tone="idle" className="size-3" />}
                              {retested(cell) && (
                                <span className="text-xs font-bold text-brand" title="Retested after the repair">
                                  R
                                </span>
                              )}
                            </span>
                          )}
                          {fault && (
                            <Link
                              to={paths.fault(fault)}
                              aria-label={`Fault on ${position.name}, ${stepTitle(step)}: locate and repair`}
                              className="absolute -top-1.5 -right-1.5 flex size-5 items-center justify-center rounded-full bg-card"
                              data-testid="cell-fault"
                            >
                              <MarkIcon shape="triangle" tone="fail" className="size-4" />
                            </Link>
                          )}
                        </div>
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <p className="mt-1 text-sm text-ink-soft">
          Limits: {limitsName}.
          {nothing.length > 0 && ` ${nothing.map((p) => p.name).join(', ')}: nothing to measure here with a multimeter.`}
        </p>
      </div>

      <aside
        aria-label="Reading entry"
        className="flex w-full flex-col gap-3 rounded-card border border-line bg-card p-3 min-[960px]:w-[18rem] min-[960px]:shrink-0"
        data-testid="grid-panel"
      >
        {complete && !again && !allOl ? (
          <div className="flex flex-col gap-2">
            <p className="text-sm font-semibold">Every step of this strip has a reading.</p>
            <Link
              ref={doneButton}
              to={nextStripId ? paths.stripTest(nextStripId) : boardHref}
              className="inline-flex min-h-14 items-center justify-center rounded-lg bg-brand px-3 text-sm font-semibold whitespace-nowrap text-white"
            >
              {nextStripId ? 'Strip complete — next strip →' : 'Strip complete — status board'}
            </Link>
          </div>
        ) : current ? (
          <div aria-live="polite" className="flex min-h-24 flex-col gap-1 text-sm" data-testid="grid-focus">
            <p className="font-semibold">
              {current.position.name} · {stepTitle(current.step)}
            </p>
            {limit && (
              <p data-testid="grid-limit">
                Limit: <strong>{limit.text}</strong> — <span className="text-ink-soft">{limit.source}</span>
              </p>
            )}
            {preview?.state === 'judged' && (
              <p className="flex items-start gap-2">
                <StatusMark {...verdictSymbol(preview.verdict.verdict)} size="sm" />
                <span>{preview.display}</span>
              </p>
            )}
            {preview?.state === 'invalid' && <p className="text-fail">{preview.message}</p>}
            {preview?.state === 'empty' && current.step.latest && (
              <p className="flex flex-wrap items-center gap-2">
                Latest: <strong className="tabular-nums">{current.step.latest.overRange ? 'OL' : current.step.latest.valueText}</strong>
                <StatusMark {...verdictSymbol(current.step.latest.verdict)} size="sm" />
              </p>
            )}
            {currentFault && (
              <Link to={paths.fault(currentFault)} className="inline-flex min-h-touch items-center font-semibold text-fail underline">
                Locate and repair this fault
              </Link>
            )}
          </div>
        ) : (
          <p className="text-sm text-ink-soft">Tap a cell to enter its reading.</p>
        )}
        {error && (
          <p role="alert" className="text-sm font-medium text-fail">
            {error}
          </p>
        )}
        {again && current && (
          <div
            role="alertdialog"
            aria-label="Record again?"
            className="flex flex-col gap-2 rounded-lg border-2 border-brass bg-brass-soft p-2 text-sm"
          >
            <p>This step has a reading already. Record again?</p>
            {/* autoFocus: focused as it is committed, not a frame later, so an Enter typed at once lands here. */}
            <div className="flex gap-3">
              <button autoFocus type="button" className={CONFIRM} onClick={() => void recordAndMove(current, again.text, true)}>
                Record again
              </button>
              <Button
                variant="secondary"
                className="min-h-14"
                onClick={() => {
                  setAgain(null);
                  focusCell(current.step.id);
                }}
              >
                Keep it
              </Button>
            </div>
          </div>
        )}
        {allOl && (
          <div
            role="alertdialog"
            aria-label="All insulation OL?"
            className="flex flex-col gap-2 rounded-lg border-2 border-brass bg-brass-soft p-2 text-sm"
          >
            <p>
              Record OL (over range, open) for every insulation pair of <strong>{rows.find((p) => p.id === allOl)?.name}</strong>?
            </p>
            <div className="flex gap-3">
              <button autoFocus type="button" className={CONFIRM} onClick={() => void recordAllOl(allOl)}>
                Record OL ×{insulationOf(allOl).filter((c) => !measured(c.step)).length || insulationOf(allOl).length}
              </button>
              <Button
                variant="secondary"
                className="min-h-14"
                onClick={() => {
                  const back = active;
                  setAllOl(null);
                  focusCell(back);
                }}
              >
                Cancel
              </Button>
            </div>
          </div>
        )}
        {canWrite && (
          <Keypad onKey={onPad} disabled={!current || busy} allInsulation={!!current && insulationOf(current.position.id).length > 0} />
        )}
      </aside>
    </div>
  );
}
