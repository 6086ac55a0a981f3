import { Fragment, useMemo, useState } from 'react';
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { CORRECTION_REASON_MIN, createReadingSchema } from '@shared/schemas/readings';
import { formatOhm } from '@shared/domain/units';
import { matchesReadingsFilter, type ReadingsFilter } from '@shared/schemas/readings-table';
import { readingValueView } from '@shared/domain/typed-reading';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { StatusMark, type MarkShape, type MarkTone } from '@/components/ui/status-mark';
import { READING_SYMBOLS } from '@shared/domain/symbols';
import type { ReadingRow } from '../api/get-venue-readings';
import type { CorrectionInput } from '../api/correct-reading';
import { useDates } from '@/lib/date-format';

const VERDICT = Object.fromEntries(
  (['pass', 'near-limit', 'fail'] as const).map((v) => [v, [READING_SYMBOLS[v].shape, READING_SYMBOLS[v].tone, READING_SYMBOLS[v].label]]),
) as Record<'pass' | 'near-limit' | 'fail', [MarkShape, MarkTone, string]>;
const col = createColumnHelper<ReadingRow>();
/** A reading typed offline reached the server a while after it was taken: say when. */
const sentLater = (r: ReadingRow) => r.receivedAt !== null && Date.parse(r.receivedAt) - Date.parse(r.takenAt) >= 60_000;

// A correction is a reading with a reason: the value and the reason as the reading's schema has them.
const correctionSchema = z.object({
  value: createReadingSchema.shape.value,
  correctionReason: createReadingSchema.shape.correctionReason.unwrap().unwrap(),
});

function CorrectionForm({
  row,
  onCorrect,
  onClose,
}: {
  row: ReadingRow;
  onCorrect: (v: CorrectionInput) => Promise<unknown>;
  onClose: () => void;
}) {
  const form = useForm<z.input<typeof correctionSchema>, unknown, z.output<typeof correctionSchema>>({
    resolver: zodResolver(correctionSchema),
    defaultValues: { value: '', correctionReason: '' },
  });
  const typed = useWatch({ control: form.control });
  const error = form.formState.errors.root?.message;
  return (
    <form
      noValidate
      className="flex flex-wrap items-end gap-3 bg-brass-soft px-4 py-3"
      onSubmit={form.handleSubmit(async (v) => {
        try {
          await onCorrect({ stepId: row.stepId, supersedesId: row.id, leadNullId: row.leadNullId, ...v });
          onClose();
        } catch (err) {
          form.setError('root', { message: err instanceof Error ? err.message : 'The correction was not saved.' });
        }
      })}
    >
      <p className="w-full text-sm">
        Correcting <strong>{row.valueText}</strong> on {row.stripLabel}, {row.positionName}, {TEST_KIND_LABELS[row.testKind]}{' '}
        {row.conductors}
        {row.leadOffsetOhm ? ` (typed with a ${formatOhm(row.leadOffsetOhm)} lead null, which the correction keeps)` : ''}. The old reading
        stays in the history. A correction closes no fault: a fault opened by a typing mistake is dismissed by the technical director.
      </p>
      <TextField label="Correct value" id={`fix-${row.id}`} autoFocus inputMode="decimal" {...form.register('value')} className="w-36" />
      <TextField
        label="Reason"
        id={`reason-${row.id}`}
        {...form.register('correctionReason')}
        className="min-w-64 flex-1"
        placeholder="e.g. typed 3.4 for 0.34"
      />
      <Button type="submit" disabled={!correctionSchema.safeParse(typed).success}>
        Save correction
      </Button>
      <p className="w-full text-xs text-ink-soft">The reason needs at least {CORRECTION_REASON_MIN} characters.</p>
      <Button variant="secondary" onClick={onClose}>
        Cancel
      </Button>
      {error && (
        <div className="w-full">
          <Notice tone="error">{error}</Notice>
        </div>
      )}
    </form>
  );
}

export function ReadingsTable({
  rows,
  canCorrect,
  onCorrect,
  filter,
  onFilterChange,
}: {
  rows: ReadingRow[];
  canCorrect: boolean;
  onCorrect: (v: CorrectionInput) => Promise<unknown>;
  /** The filters live with the page, which sends them with the export link too. */
  filter: ReadingsFilter;
  onFilterChange: (f: ReadingsFilter) => void;
}) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [correcting, setCorrecting] = useState<string | null>(null);
  const byId = useMemo(() => new Map(rows.map((r) => [r.id, r])), [rows]);
  // The venue's clock, in the table and in the from/until inputs alike.
  const dates = useDates();
  const when = dates.shortDateTime;
  const toLocalInput = (iso: string | undefined) => (iso ? dates.toInput(iso) : '');
  const fromLocalInput = dates.fromInput;

  const columns = useMemo(
    () => [
      col.accessor('stripLabel', {
        header: 'Strip',
        sortingFn: (a, b) =>
          a.original.stripSort - b.original.stripSort ||
          a.original.positionSort - b.original.positionSort ||
          a.original.stepSort - b.original.stepSort,
        cell: (c) => (
          <span>
            <span className="font-semibold whitespace-nowrap">{c.getValue()}</span>
            <span className="block text-xs text-ink-soft">{c.row.original.positionName}</span>
          </span>
        ),
      }),
      col.accessor('assetTag', {
        header: 'Tag',
        cell: (c) => <span className="whitespace-nowrap font-mono text-xs">{c.getValue() ?? '—'}</span>,
      }),
      col.accessor('testKind', {
        header: 'Test',
        cell: (c) => `${TEST_KIND_LABELS[c.getValue()]} ${c.row.original.conductors}`,
      }),
      col.accessor('valueText', {
        header: 'Value',
        sortingFn: (a, b) => (a.original.valueOhm ?? Infinity) - (b.original.valueOhm ?? Infinity),
        cell: (c) => {
          // The value judged, with its unit; when a lead null was subtracted, what was typed too.
          const v = readingValueView(c.row.original);
          return (
            <span>
              <span className="whitespace-nowrap font-mono font-semibold" data-value>
                {v.value}
              </span>
              {v.typed && (
                <span className="block whitespace-nowrap text-xs text-ink-soft" data-testid="value-typed">
                  typed {v.typed} − {v.leadNull} lead null{c.row.original.leadNullMeter ? ` (${c.row.original.leadNullMeter})` : ''}
                </span>
              )}
            </span>
          );
        },
      }),
      col.accessor('verdict', {
        header: 'Verdict',
        cell: (c) => {
          const [shape, tone, label] = VERDICT[c.getValue()];
          return <StatusMark shape={shape} tone={tone} label={label} size="sm" />;
        },
      }),
      col.accessor('limitOhm', {
        header: 'Limit and source',
        cell: (c) => (
          <span>
            <span className="whitespace-nowrap">
              {c.getValue() === null ? '—' : `${c.row.original.limitKind === 'min' ? '≥' : '≤'} ${formatOhm(c.getValue()!)}`}
            </span>
            <span className="block max-w-48 text-xs text-ink-soft">{c.row.original.source}</span>
          </span>
        ),
      }),
      col.accessor((r) => `${r.profileName ?? '?'} v${r.profileVersion}`, {
        id: 'profile',
        header: 'Profile',
        cell: (c) => <span className="text-xs">{c.getValue()}</span>,
      }),
      col.accessor('takenAt', {
        header: 'When, who',
        cell: (c) => (
          <span className="text-xs">
            <span className="whitespace-nowrap">{when(c.getValue())}</span>
            {sentLater(c.row.original) && (
              <span className="block whitespace-nowrap text-ink-soft">sent {when(c.row.original.receivedAt!)}</span>
            )}
            <span className="block">{c.row.original.takenByName}</span>
          </span>
        ),
      }),
      col.display({
        id: 'history',
        header: 'Correction',
        cell: (c) => {
          const r = c.row.original;
          const newer = r.supersededBy ? byId.get(r.supersededBy) : null;
          return (
            <div className="flex flex-col items-start gap-1 text-xs">
              {newer && (
                <span className="font-semibold text-near">
                  Superseded by {newer.valueText} ({when(newer.takenAt)})
                </span>
              )}
              {r.supersedesId && (
                <span>
                  Corrects {byId.get(r.supersedesId)?.valueText ?? 'an earlier reading'}: “{r.correctionReason}”
                </span>
              )}
              {canCorrect && !r.superseded && (
                <Button variant="ghost" className="-ml-2 text-sm" onClick={() => setCorrecting(correcting === r.id ? null : r.id)}>
                  Correct
                </Button>
              )}
            </div>
          );
        },
      }),
    ],
    [byId, canCorrect, correcting, when],
  );

  const visible = useMemo(() => rows.filter((r) => matchesReadingsFilter(r, filter)), [rows, filter]);
  const table = useReactTable({
    data: visible,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const setFilter = <K extends keyof ReadingsFilter>(key: K, value: ReadingsFilter[K] | '') =>
    onFilterChange({ ...filter, [key]: value || undefined });
  const distinct = (pick: (r: ReadingRow) => string) => [...new Set(rows.map(pick))];
  const strips = [...new Map(rows.map((r) => [r.stripId, r])).values()].sort((a, b) => a.stripSort - b.stripSort);
  const people = [...new Map(rows.filter((r) => r.takenBy).map((r) => [r.takenBy!, r.takenByName ?? '—'])).entries()];

  return (
    <div>
      <div className="grid gap-3 border-b border-line p-4 sm:grid-cols-3 lg:grid-cols-6">
        <SelectField label="Strip" name="fStrip" value={filter.strip ?? ''} onChange={(e) => setFilter('strip', e.target.value)}>
          <option value="">All strips</option>
          {strips.map((s) => (
            <option key={s.stripId} value={s.stripId}>
              {s.stripLabel}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Verdict"
          name="fVerdict"
          value={filter.verdict ?? ''}
          onChange={(e) => setFilter('verdict', e.target.value as ReadingsFilter['verdict'])}
        >
          <option value="">Any verdict</option>
          {(['pass', 'near-limit', 'fail'] as const).map((v) => (
            <option key={v} value={v}>
              {VERDICT[v][2]}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Test"
          name="fTest"
          value={filter.test ?? ''}
          onChange={(e) => setFilter('test', e.target.value as ReadingsFilter['test'])}
        >
          <option value="">Any test</option>
          {distinct((r) => r.testKind).map((k) => (
            <option key={k} value={k}>
              {TEST_KIND_LABELS[k as ReadingRow['testKind']]}
            </option>
          ))}
        </SelectField>
        <SelectField label="Who" name="fWho" value={filter.who ?? ''} onChange={(e) => setFilter('who', e.target.value)}>
          <option value="">Anyone</option>
          {people.map(([id, name]) => (
            <option key={id} value={id}>
              {name}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Taken from"
          name="fFrom"
          type="datetime-local"
          value={toLocalInput(filter.from)}
          onChange={(e) => setFilter('from', fromLocalInput(e.target.value))}
        />
        <TextField
          label="Taken until"
          name="fTo"
          type="datetime-local"
          value={toLocalInput(filter.to)}
          onChange={(e) => setFilter('to', fromLocalInput(e.target.value))}
        />
      </div>
      <p className="px-4 py-2 text-sm text-ink-soft" aria-live="polite">
        {visible.length} of {rows.length} readings · superseded readings stay listed, struck through
      </p>
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead className="border-y border-line bg-paper text-xs uppercase tracking-wide text-ink-soft">
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      className="px-2 py-1"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                    >
                      {h.column.getCanSort() ? (
                        <button
                          type="button"
                          className="inline-flex min-h-touch items-center gap-1 font-semibold uppercase"
                          onClick={h.column.getToggleSortingHandler()}
                        >
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden>{sorted === 'asc' ? '↑' : sorted === 'desc' ? '↓' : '↕'}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <Fragment key={row.id}>
                <tr
                  className={`border-b border-line align-top ${row.original.superseded ? 'bg-idle-soft/60 text-ink-soft [&_[data-value]]:line-through' : ''}`}
                >
                  {row.getVisibleCells().map((c) => (
                    <td key={c.id} className="px-2 py-2">
                      {flexRender(c.column.columnDef.cell, c.getContext())}
                    </td>
                  ))}
                </tr>
                {correcting === row.original.id && (
                  <tr>
                    <td colSpan={row.getVisibleCells().length}>
                      <CorrectionForm row={row.original} onCorrect={onCorrect} onClose={() => setCorrecting(null)} />
                    </td>
                  </tr>
                )}
              </Fragment>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
