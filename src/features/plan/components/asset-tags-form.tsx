import { useEffect, useImperativeHandle, useMemo, useRef, useState, type ClipboardEvent, type KeyboardEvent, type Ref } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { assetTagsSchema, type AssetTagsInput } from '@shared/schemas/plan';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import type { EquipmentKind } from '@shared/domain/limits';
import { Notice } from '@/components/ui/card';
import { bodyResolver } from '@/lib/form-resolver';
import type { PlanPosition, PlanStrip } from '../api/types';

type Row = { strip: PlanStrip; position: PlanPosition };
type TagsForm = { positions: { positionId: string; assetTag: string }[] };
export type FieldProblem = { path: string; message: string };
type Rows = AssetTagsInput['positions'];

/** What the strip card asks of the table when it saves: the changed rows, and where a refusal points. */
export interface TagsHandle {
  /** The rows whose tag changed ([] when none), or null when the table shows a problem to fix first. */
  collect: () => Promise<Rows | null>;
  /** Puts the server's messages (paths `<field>.<n>.assetTag` of the rows sent) beside their rows. */
  showProblems: (problems: FieldProblem[], sent: Rows) => void;
}

/** Cells of a pasted block: one per line, the first column when the block has several (tab-separated). */
export function pastedColumn(text: string): string[] {
  const lines = text.replace(/\r\n?/g, '\n').split('\n');
  while (lines.length > 0 && lines[lines.length - 1].trim() === '') lines.pop();
  return lines.map((l) => l.split('\t')[0].trim().toUpperCase());
}

const toBody = (v: TagsForm): AssetTagsInput => ({
  positions: v.positions.map((p) => ({ positionId: p.positionId, assetTag: p.assetTag.trim() === '' ? null : p.assetTag })),
});

/**
 * The asset tags of every position of a strip, or of a whole row, in one table and one save. A
 * column pasted from a spreadsheet fills down from the cell it lands in; Enter moves down (a
 * scanner ends each code with Enter). The strip card saves it with its details: only the rows that
 * changed are sent, and the server saves all of them or none.
 */
function TagsTable({
  rows,
  handle,
  onSubmit,
  onDirty,
}: {
  rows: Row[];
  handle: Ref<TagsHandle>;
  onSubmit: () => void;
  onDirty: (dirty: boolean) => void;
}) {
  const shown = useMemo<TagsForm>(
    () => ({ positions: rows.map(({ position }) => ({ positionId: position.id, assetTag: position.equipment?.assetTag ?? '' })) }),
    [rows],
  );
  const form = useForm<TagsForm, unknown, z.output<typeof assetTagsSchema>>({
    resolver: bodyResolver(assetTagsSchema, toBody),
    defaultValues: shown,
    reValidateMode: 'onSubmit',
  });
  const inputs = useRef<(HTMLInputElement | null)[]>([]);
  const [overflow, setOverflow] = useState<string[]>([]);
  const errors = form.formState.errors.positions;

  function onPaste(i: number, e: ClipboardEvent<HTMLInputElement>) {
    const cells = pastedColumn(e.clipboardData.getData('text'));
    if (cells.length < 2) return; // one value: the browser pastes it as usual
    e.preventDefault();
    cells.slice(0, rows.length - i).forEach((tag, k) => form.setValue(`positions.${i + k}.assetTag`, tag, { shouldDirty: true }));
    setOverflow(cells.slice(rows.length - i));
    form.clearErrors('positions');
    inputs.current[Math.min(i + cells.length, rows.length) - 1]?.focus();
  }
  function onKeyDown(i: number, e: KeyboardEvent<HTMLInputElement>) {
    if (e.key !== 'Enter' || i === rows.length - 1) return;
    e.preventDefault();
    inputs.current[i + 1]?.focus();
  }
  const dirty = form.formState.isDirty;
  useEffect(() => onDirty(dirty), [dirty, onDirty]);
  useImperativeHandle(handle, () => ({
    collect: () =>
      new Promise<Rows | null>((resolve) => {
        void form.handleSubmit(
          (body) => resolve(body.positions.filter((p, i) => p.assetTag !== (rows[i].position.equipment?.assetTag ?? null))),
          () => resolve(null),
        )();
      }),
    showProblems: (problems, sent) => {
      for (const problem of problems) {
        const m = /\.(\d+)\.(assetTag|positionId)$/.exec(problem.path);
        const row = m ? rows.findIndex((r) => r.position.id === sent[Number(m[1])]?.positionId) : -1;
        if (row >= 0) form.setError(`positions.${row}.assetTag`, { type: 'server', message: problem.message });
      }
    },
  }));

  return (
    <form
      noValidate
      aria-label="Asset tags"
      className="flex flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        onSubmit();
      }}
    >
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-line text-left">
              <th scope="col" className="py-2 pr-3 font-medium">
                Strip
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Position
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Takes a
              </th>
              <th scope="col" className="py-2 font-medium">
                Asset tag
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map(({ strip, position }, i) => {
              const id = `bulk-tag-${position.id}`;
              const error = errors?.[i]?.assetTag?.message;
              const field = form.register(`positions.${i}.assetTag`, { onChange: () => form.clearErrors(`positions.${i}.assetTag`) });
              return (
                <tr key={position.id} className="border-b border-line/60 align-top">
                  <td className="py-1.5 pr-3">{strip.label}</td>
                  <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                    <label htmlFor={id}>{position.name}</label>
                  </th>
                  <td className="py-1.5 pr-3 text-ink-soft">{EQUIPMENT_KIND_LABELS[position.equipmentKind]}</td>
                  <td className="py-1.5">
                    <input
                      id={id}
                      autoComplete="off"
                      spellCheck={false}
                      aria-invalid={error ? true : undefined}
                      aria-describedby={error ? `${id}-error` : undefined}
                      className="min-h-touch w-full min-w-32 rounded-lg border border-line bg-card px-3 font-mono uppercase aria-invalid:border-fail"
                      {...field}
                      ref={(el) => {
                        field.ref(el);
                        inputs.current[i] = el;
                      }}
                      onPaste={(e) => onPaste(i, e)}
                      onKeyDown={(e) => onKeyDown(i, e)}
                    />
                    {error && (
                      <p id={`${id}-error`} role="alert" className="mt-1 text-xs font-medium text-fail">
                        {error}
                      </p>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {overflow.length > 0 && (
        <Notice tone="caution">
          {overflow.length} pasted tag{overflow.length === 1 ? '' : 's'} did not fit below that row and{' '}
          {overflow.length === 1 ? 'was' : 'were'} left out: {overflow.join(', ')}.
        </Notice>
      )}
      <p className="text-xs text-ink-soft">
        An empty cell takes the item off. Paste a column from a spreadsheet into a cell to fill the cells below it. Save strip saves the
        tags with the strip's details: all together or none.
      </p>
    </form>
  );
}

type Scope = 'strip' | 'row';

/** Chooses the positions (this strip or its whole row, all kinds or one) and shows their table. */
export function AssetTagsForm({
  strip,
  strips,
  handle,
  onSubmit,
  onDirty,
}: {
  strip: PlanStrip;
  /** Every strip of the venue, for the row choice. */
  strips: PlanStrip[];
  handle: Ref<TagsHandle>;
  onSubmit: () => void;
  onDirty: (dirty: boolean) => void;
}) {
  const row = strip.zone ? strips.filter((s) => s.zone === strip.zone) : [strip];
  const [scope, setScope] = useState<Scope>('strip');
  const [kind, setKind] = useState<EquipmentKind | 'all'>('all');
  const inScope = scope === 'row' ? row : [strip];
  const kinds = [...new Set(inScope.flatMap((s) => s.positions.map((p) => p.equipmentKind)))];
  const rows = inScope.flatMap((s) =>
    s.positions.filter((p) => kind === 'all' || p.equipmentKind === kind).map((position) => ({ strip: s, position })),
  );
  // The table starts afresh when the choice or the saved plan changes.
  const key = `${scope}-${kind}-${rows.map((r) => `${r.position.id}:${r.position.equipment?.assetTag ?? ''}`).join(',')}`;
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-4">
        <fieldset className="flex flex-wrap gap-x-4">
          <legend className="mb-1 text-sm font-medium">Positions of</legend>
          <label className="flex min-h-touch items-center gap-2 text-sm">
            <input
              type="radio"
              className="size-5 accent-brand"
              name={`scope-${strip.id}`}
              checked={scope === 'strip'}
              onChange={() => setScope('strip')}
            />
            {strip.label} only
          </label>
          {row.length > 1 && (
            <label className="flex min-h-touch items-center gap-2 text-sm">
              <input
                type="radio"
                className="size-5 accent-brand"
                name={`scope-${strip.id}`}
                checked={scope === 'row'}
                onChange={() => setScope('row')}
              />
              the whole of {strip.zone} ({row.length} strips)
            </label>
          )}
        </fieldset>
        <label className="flex flex-col gap-1 text-sm font-medium">
          Which items
          <select
            className="min-h-touch rounded-lg border border-line bg-card px-3 font-normal"
            value={kind}
            onChange={(e) => setKind(e.target.value as EquipmentKind | 'all')}
          >
            <option value="all">All positions</option>
            {kinds.map((k) => (
              <option key={k} value={k}>
                {EQUIPMENT_KIND_LABELS[k]} positions only
              </option>
            ))}
          </select>
        </label>
      </div>
      {rows.length === 0 ? (
        <p className="text-sm text-ink-soft">No positions to show.</p>
      ) : (
        <TagsTable key={key} rows={rows} handle={handle} onSubmit={onSubmit} onDirty={onDirty} />
      )}
    </div>
  );
}
