import { useState } from 'react';
import {
  IMPORT_FIELD_LABELS,
  IMPORT_FIELDS,
  IMPORT_LIMITS,
  IMPORT_MODE_LABELS,
  IMPORT_MODES,
  type ImportAction,
  type ImportField,
  type ImportMapping,
  type ImportMode,
  type ImportPreview,
  type ImportReport,
  type ImportRowResult,
} from '@shared/schemas/equipment-import';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { Button } from '@/components/ui/button';
import { Card, Notice } from '@/components/ui/card';
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

/** Upload a spreadsheet → check the column mapping and each row → import the good rows → the report. */
export function ImportWizard({ itemHref }: { itemHref: (id: string) => string }) {
  const [file, setFile] = useState<File | null>(null);
  const [mode, setMode] = useState<ImportMode>('create-and-update');
  const [mapping, setMapping] = useState<ImportMapping | undefined>(undefined);
  const [onlyProblems, setOnlyProblems] = useState(false);
  const preview = usePreviewImport();
  const run = useRunImport();
  const data = preview.data;

  const check = (f: File, m: ImportMapping | undefined, md: ImportMode) => {
    run.reset();
    preview.mutate({ file: f, mapping: m, mode: md });
  };

  const choose = (f: File | undefined) => {
    if (!f) return;
    setFile(f);
    setMapping(undefined);
    check(f, undefined, mode);
  };

  const setColumn = (field: ImportField, value: string) => {
    const next: ImportMapping = { ...(mapping ?? data?.mapping ?? {}) };
    if (value === '') next[field] = null;
    else next[field] = Number(value);
    setMapping(next);
    if (file) check(file, next, mode);
  };

  const current = mapping ?? data?.mapping ?? {};
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
          <SelectField
            label="What to do with tags already in the register"
            name="mode"
            value={mode}
            onChange={(e) => {
              const md = e.target.value as ImportMode;
              setMode(md);
              if (file) check(file, mapping, md);
            }}
          >
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
              Suggested from the header row of {data.fileName}. A length column in feet is converted to metres (from a unit in the cell,
              the unit column, or the header such as “Length (ft)”).
            </p>
            <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
              {IMPORT_FIELDS.map((field) => (
                <SelectField
                  key={field}
                  label={IMPORT_FIELD_LABELS[field]}
                  name={`map-${field}`}
                  value={current[field] == null ? '' : String(current[field])}
                  onChange={(e) => setColumn(field, e.target.value)}
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
              <table className="w-full text-left text-sm" data-testid="import-preview">
                <thead className="sticky top-0 border-b border-line bg-paper text-xs uppercase tracking-wide text-ink-soft">
                  <tr>
                    <th className="px-3 py-2">Row</th>
                    <th className="px-3 py-2">Result</th>
                    <th className="px-3 py-2">Asset tag</th>
                    <th className="px-3 py-2">Kind</th>
                    <th className="px-3 py-2">Length</th>
                    <th className="px-3 py-2">What happens</th>
                  </tr>
                </thead>
                <tbody>
                  {data.rows
                    .filter((r) => !onlyProblems || r.action === 'error')
                    .map((r) => (
                      <PreviewRow key={r.row} r={r} />
                    ))}
                </tbody>
              </table>
            </div>
          </Card>

          <Card>
            <h2 className="text-lg font-semibold">4. Import</h2>
            <p className="mb-3 mt-1 text-sm text-ink-soft">
              The {data.summary.create + data.summary.update} good rows are written together; rows marked “Not imported” are left out and
              listed in the report.
            </p>
            <Button
              onClick={() => file && run.mutate({ file, mapping: current, mode })}
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

function PreviewRow({ r }: { r: ImportRowResult }) {
  const [shape, tone, label] = ACTION_LOOK[r.action];
  const bad = r.action === 'error';
  return (
    <tr className={`border-b border-line align-top last:border-0 ${bad ? 'bg-fail-soft' : ''}`} data-row={r.row} data-action={r.action}>
      <td className="px-3 py-2 tabular-nums text-ink-soft">{r.row}</td>
      <td className="px-3 py-2">
        <span className="flex items-center gap-1 whitespace-nowrap font-medium">
          <MarkIcon shape={shape} tone={tone} /> {label}
        </span>
      </td>
      <td className="px-3 py-2 font-mono">{r.assetTag ?? '—'}</td>
      <td className="px-3 py-2">{r.values.kind ? (EQUIPMENT_KIND_LABELS[r.values.kind as keyof typeof EQUIPMENT_KIND_LABELS] ?? r.values.kind) : '—'}</td>
      <td className="whitespace-nowrap px-3 py-2 tabular-nums">{r.values.lengthM != null ? `${r.values.lengthM} m` : '—'}</td>
      <td className="px-3 py-2">
        {bad ? (
          <ul className="list-disc pl-4 text-fail">
            {r.errors.map((e, i) => (
              <li key={i}>
                <span className="font-medium">{e.field === 'row' ? 'Row' : IMPORT_FIELD_LABELS[e.field]}:</span> {e.message}
              </li>
            ))}
          </ul>
        ) : r.action === 'update' && r.changes ? (
          <ul className="text-ink-soft">
            {Object.entries(r.changes).map(([k, c]) => (
              <li key={k}>
                {CHANGE_LABELS[k] ?? k}: {show(c.from)} → <span className="font-medium text-ink">{show(c.to)}</span>
              </li>
            ))}
          </ul>
        ) : (
          <span className="text-ink-soft">{r.message}</span>
        )}
      </td>
    </tr>
  );
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
                <span className="text-ink-soft">{Object.keys(u.changes).map((k) => CHANGE_LABELS[k] ?? k).join(', ')}</span>
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
