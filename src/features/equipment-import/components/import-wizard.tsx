import { useEffect, useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { createColumnHelper, getCoreRowModel, getFilteredRowModel, useReactTable } from '@tanstack/react-table';
import { z } from 'zod';
import {
  IMPORT_FIELD_LABELS,
  IMPORT_FIELDS,
  IMPORT_LIMITS,
  IMPORT_MODE_LABELS,
  IMPORT_MODES,
  importMappingSchema,
  importOptionsSchema,
  type ImportAction,
  type ImportMapping,
  type ImportMode,
  type ImportPreview,
  type ImportReport,
  type ImportRowResult,
} from '@shared/schemas/equipment-import';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { Button } from '@/components/ui/button';
import { Card, Notice } from '@/components/ui/card';
import { DataTable } from '@/components/ui/data-table';
import { SelectField } from '@/components/ui/field';
import { MarkIcon, type MarkShape, type MarkTone } from '@/components/ui/status-mark';
import { usePreviewImport } from '../api/preview-import';
import { useRunImport } from '../api/run-import';

const CHANGE_LABELS: Record<string, string> = {
  kind: 'kind',
  description: 'description',
  lengthM: 'length (m)',
  conductorMm2: 'conductor (mm²)',
  awg: 'AWG',
  cableType: 'cable type',
  velocityFactor: 'velocity factor',
  status: 'status',
  notes: 'notes',
};
const show = (v: unknown) => (v === null || v === undefined || v === '' ? '—' : String(v));

const ACTION_LOOK: Record<ImportAction, [MarkShape, MarkTone, string]> = {
  create: ['circle', 'pass', 'New'],
  update: ['square', 'brand', 'Update'],
  unchanged: ['dash', 'idle', 'No change'],
  skip: ['dash', 'idle', 'Skipped'],
  error: ['octagon', 'fail', 'Not imported'],
};

// The options sent beside the file, as the form holds them: the mapping already parsed.
const importFormSchema = z.object({ mode: importOptionsSchema.shape.mode.unwrap(), mapping: importMappingSchema });
type ImportForm = z.input<typeof importFormSchema>;
const columnOf = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v));
/** Every field named, so a select the answer leaves out shows "not imported". */
const fullMapping = (m: ImportMapping): ImportMapping => Object.fromEntries(IMPORT_FIELDS.map((f) => [f, m[f] ?? null]));

/** Upload a spreadsheet → check the column mapping and each row → import the good rows → the report. */
export function ImportWizard({ itemHref }: { itemHref: (id: string) => string }) {
  const [file, setFile] = useState<File | null>(null);
  const [onlyProblems, setOnlyProblems] = useState(false);
  const form = useForm<ImportForm, unknown, z.output<typeof importFormSchema>>({
    resolver: zodResolver(importFormSchema),
    defaultValues: { mode: 'create-and-update', mapping: {} },
  });
  const preview = usePreviewImport();
  const run = useRunImport();
  const data = preview.data;

  // The mapping the server read the file with is the one shown (its suggestion, or the one sent).
  useEffect(() => {
    if (data) form.setValue('mapping', fullMapping(data.mapping));
  }, [data, form]);

  const check = (f: File, m: ImportMapping | undefined, md: ImportMode) => {
    run.reset();
    preview.mutate({ file: f, mapping: m, mode: md });
  };

  const choose = (f: File | undefined) => {
    if (!f) return;
    setFile(f);
    check(f, undefined, form.getValues('mode'));
  };

  // A changed column or mode reads the file again with it; nothing is written.
  const recheck = () => {
    const { mode, mapping } = form.getValues();
    if (file) check(file, data ? mapping : undefined, mode);
  };
  const report = run.data;

  return (
    <div className="flex flex-col gap-4">
      <Card>
        <h2 className="text-lg font-semibold">1. Choose the spreadsheet</h2>
        <p className="mb-3 mt-1 text-sm text-ink-soft">
          A CSV or Excel (.xlsx) file with a header row and one item per row, up to {IMPORT_LIMITS.maxRows.toLocaleString('en')} rows and{' '}
          {IMPORT_LIMITS.maxColumns} columns ({IMPORT_LIMITS.maxBytes / (1024 * 1024)} MB). Nothing is written until you press Import.
        </p>
        <div className="flex flex-wrap items-end gap-4">
          <label className="flex flex-col gap-1 text-sm font-medium">
            Spreadsheet
            <input
              type="file"
              accept=".csv,.txt,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
              onChange={(e) => choose(e.currentTarget.files?.[0])}
              className="min-h-touch rounded-lg border border-line bg-card px-3 py-2 text-base file:mr-3 file:rounded file:border-0 file:bg-brand-soft file:px-3 file:py-1 file:text-brand"
              data-testid="import-file"
            />
          </label>
          <SelectField label="What to do with tags already in the register" {...form.register('mode', { onChange: recheck })}>
            {IMPORT_MODES.map((m) => (
              <option key={m} value={m}>
                {IMPORT_MODE_LABELS[m]}
              </option>
            ))}
          </SelectField>
        </div>
        {preview.isPending && <p className="mt-3 text-sm text-ink-soft">Reading the file…</p>}
        {preview.isError && (
          <div className="mt-3">
            <Notice tone="error">{preview.error.message}</Notice>
          </div>
        )}
      </Card>

      {data && !preview.isError && (
        <>
          <Card>
            <h2 className="text-lg font-semibold">2. Which column is which</h2>
            <p className="mb-3 mt-1 text-sm text-ink-soft">
              Suggested from the header row of {data.fileName}. A length column in feet is converted to metres (from a unit in the cell, the
              unit column, or the header such as “Length (ft)”).
            </p>
            <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
              {IMPORT_FIELDS.map((field) => (
                <SelectField
                  key={field}
                  label={IMPORT_FIELD_LABELS[field]}
                  id={`f-map-${field}`}
                  {...form.register(`mapping.${field}`, { setValueAs: columnOf, onChange: recheck })}
                >
                  <option value="">— not imported —</option>
                  {data.columns.map((c) => (
                    <option key={c.index} value={c.index}>
                      {c.header || `Column ${c.index + 1}`}
                      {c.samples[0] ? ` (e.g. ${c.samples[0].slice(0, 24)})` : ''}
                    </option>
                  ))}
                </SelectField>
              ))}
            </div>
          </Card>

          <Card className="p-0!">
            <div className="flex flex-wrap items-center justify-between gap-3 border-b border-line px-5 py-3">
              <h2 className="text-lg font-semibold">3. Check the rows</h2>
              <Summary summary={data.summary} />
              <label className="flex min-h-touch items-center gap-2 text-sm">
                <input type="checkbox" className="size-5" checked={onlyProblems} onChange={(e) => setOnlyProblems(e.target.checked)} />
                Only rows that will not be imported
              </label>
            </div>
            <div className="max-h-[32rem] overflow-auto">
              <PreviewTable rows={data.rows} onlyProblems={onlyProblems} />
            </div>
          </Card>

          <Card>
            <h2 className="text-lg font-semibold">4. Import</h2>
            <p className="mb-3 mt-1 text-sm text-ink-soft">
              The {data.summary.create + data.summary.update} good rows are written together; rows marked “Not imported” are left out and
              listed in the report.
            </p>
            <Button
              onClick={form.handleSubmit((v) => file && run.mutate({ file, mapping: v.mapping, mode: v.mode }))}
              disabled={!file || run.isPending || data.summary.create + data.summary.update === 0 || run.isSuccess}
            >
              {run.isPending ? 'Importing…' : `Import ${data.summary.create} new and ${data.summary.update} updated`}
            </Button>
            {run.isError && (
              <div className="mt-3">
                <Notice tone="error">{run.error.message}</Notice>
              </div>
            )}
          </Card>
        </>
      )}

      {report && <ReportView report={report} itemHref={itemHref} />}
    </div>
  );
}

function Summary({ summary }: { summary: ImportPreview['summary'] }) {
  return (
    <ul className="flex flex-wrap gap-3 text-sm" aria-label="Summary">
      {(Object.keys(ACTION_LOOK) as ImportAction[])
        .filter((a) => summary[a] > 0)
        .map((a) => {
          const [shape, tone, label] = ACTION_LOOK[a];
          return (
            <li key={a} className="flex items-center gap-1">
              <MarkIcon shape={shape} tone={tone} /> {summary[a]} {label.toLowerCase()}
            </li>
          );
        })}
    </ul>
  );
}

const col = createColumnHelper<ImportRowResult>();
const previewColumns = [
  col.accessor('row', { header: 'Row', meta: { cellClassName: 'tabular-nums text-ink-soft' } }),
  col.accessor('action', {
    header: 'Result',
    // "Only rows that will not be imported".
    filterFn: (row, id, onlyProblems) => !onlyProblems || row.getValue(id) === 'error',
    cell: (c) => {
      const [shape, tone, label] = ACTION_LOOK[c.getValue()];
      return (
        <span className="flex items-center gap-1 whitespace-nowrap font-medium">
          <MarkIcon shape={shape} tone={tone} /> {label}
        </span>
      );
    },
  }),
  col.accessor('assetTag', { header: 'Asset tag', cell: (c) => c.getValue() ?? '—', meta: { cellClassName: 'font-mono' } }),
  col.accessor((r) => r.values.kind, {
    id: 'kind',
    header: 'Kind',
    cell: (c) => {
      const kind = c.getValue();
      return kind ? (EQUIPMENT_KIND_LABELS[kind as keyof typeof EQUIPMENT_KIND_LABELS] ?? kind) : '—';
    },
  }),
  col.accessor((r) => r.values.lengthM, {
    id: 'length',
    header: 'Length',
    cell: (c) => (c.getValue() != null ? `${c.getValue()} m` : '—'),
    meta: { cellClassName: 'whitespace-nowrap tabular-nums' },
  }),
  col.display({ id: 'what', header: 'What happens', cell: (c) => <WhatHappens r={c.row.original} /> }),
];
const previewLook = {
  table: 'w-full text-left text-sm',
  head: 'sticky top-0 border-b border-line bg-paper text-xs uppercase tracking-wide text-ink-soft',
  th: 'px-3 py-2',
  row: 'border-b border-line align-top last:border-0',
  td: 'px-3 py-2',
};

function PreviewTable({ rows, onlyProblems }: { rows: ImportRowResult[]; onlyProblems: boolean }) {
  // A new filter list on every render would make the table recompute and reset itself in a loop.
  const columnFilters = useMemo(() => [{ id: 'action', value: onlyProblems }], [onlyProblems]);
  const table = useReactTable({
    data: rows,
    columns: previewColumns,
    state: { columnFilters },
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getRowId: (r) => String(r.row),
  });
  return (
    <DataTable
      table={table}
      look={previewLook}
      data-testid="import-preview"
      rowProps={(row) => ({
        className: row.original.action === 'error' ? 'bg-fail-soft' : undefined,
        'data-row': row.original.row,
        'data-action': row.original.action,
      })}
    />
  );
}

function WhatHappens({ r }: { r: ImportRowResult }) {
  if (r.action === 'error') {
    return (
      <ul className="list-disc pl-4 text-fail">
        {r.errors.map((e, i) => (
          <li key={i}>
            <span className="font-medium">{e.field === 'row' ? 'Row' : IMPORT_FIELD_LABELS[e.field]}:</span> {e.message}
          </li>
        ))}
      </ul>
    );
  }
  if (r.action === 'update' && r.changes) {
    return (
      <ul className="text-ink-soft">
        {Object.entries(r.changes).map(([k, c]) => (
          <li key={k}>
            {CHANGE_LABELS[k] ?? k}: {show(c.from)} → <span className="font-medium text-ink">{show(c.to)}</span>
          </li>
        ))}
      </ul>
    );
  }
  return <span className="text-ink-soft">{r.message}</span>;
}

function ReportView({ report, itemHref }: { report: ImportReport; itemHref: (id: string) => string }) {
  return (
    <Card data-testid="import-report">
      <h2 className="text-lg font-semibold">Imported</h2>
      <p className="mt-1 text-sm">
        {report.created.length} created, {report.updated.length} updated, {report.skipped.length} skipped.
      </p>
      <div className="mt-3 grid gap-4 md:grid-cols-3">
        <div>
          <h3 className="font-medium">Created</h3>
          <ul className="text-sm">
            {report.created.map((c) => (
              <li key={c.id}>
                <a className="text-brand underline" href={itemHref(c.id)}>
                  {c.assetTag}
                </a>{' '}
                <span className="text-ink-soft">(row {c.row})</span>
              </li>
            ))}
          </ul>
        </div>
        <div>
          <h3 className="font-medium">Updated</h3>
          <ul className="text-sm">
            {report.updated.map((u) => (
              <li key={u.id}>
                <a className="text-brand underline" href={itemHref(u.id)}>
                  {u.assetTag}
                </a>{' '}
                <span className="text-ink-soft">
                  {Object.keys(u.changes)
                    .map((k) => CHANGE_LABELS[k] ?? k)
                    .join(', ')}
                </span>
              </li>
            ))}
          </ul>
        </div>
        <div>
          <h3 className="font-medium">Skipped</h3>
          <ul className="text-sm">
            {report.skipped.map((s) => (
              <li key={s.row}>
                Row {s.row} {s.assetTag ?? ''}: <span className="text-ink-soft">{s.reason}</span>
              </li>
            ))}
          </ul>
        </div>
      </div>
    </Card>
  );
}
