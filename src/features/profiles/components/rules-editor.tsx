import { useState } from 'react';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { EQUIPMENT_KINDS, HOUSE_RULE_SOURCE, TEST_KINDS, type EquipmentKind, type LimitRule, type TestKind } from '@shared/domain/limits';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import type { UpdateProfileInput } from '@shared/schemas/limit-profile';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { ApiError } from '@/lib/api-client';

type LimitKind = 'max' | 'per-metre' | 'min';
interface Row {
  id: string;
  equipmentKind: EquipmentKind;
  testKind: TestKind;
  limitKind: LimitKind;
  value: string;
  allowance: string;
  near: string;
  source: string;
  houseRule: boolean;
  note: string;
}

const toRow = (r: LimitRule): Row => ({
  id: r.id,
  equipmentKind: r.equipmentKind,
  testKind: r.testKind,
  limitKind: r.minOhm !== undefined ? 'min' : r.maxOhmPerMetre !== undefined ? 'per-metre' : 'max',
  value: String(r.minOhm ?? r.maxOhmPerMetre ?? r.maxOhm ?? ''),
  allowance: r.connectorAllowanceOhm !== undefined ? String(r.connectorAllowanceOhm) : '',
  near: r.nearMinOhm !== undefined ? String(r.nearMinOhm) : r.nearLimitFraction !== undefined ? String(r.nearLimitFraction) : '',
  source: r.source,
  houseRule: r.houseRule,
  note: r.note ?? '',
});

const num = (s: string) => (s.trim() === '' ? undefined : Number(s.replace(',', '.')));

function toRule(r: Row): LimitRule {
  const base = { id: r.id, equipmentKind: r.equipmentKind, testKind: r.testKind, source: r.source, houseRule: r.houseRule, ...(r.note ? { note: r.note } : {}) };
  const value = num(r.value);
  const near = num(r.near);
  if (r.limitKind === 'min') return { ...base, minOhm: value, ...(near !== undefined ? { nearMinOhm: near } : {}) } as LimitRule;
  const allowance = num(r.allowance);
  return {
    ...base,
    ...(r.limitKind === 'per-metre' ? { maxOhmPerMetre: value } : { maxOhm: value }),
    ...(r.limitKind === 'per-metre' && allowance !== undefined ? { connectorAllowanceOhm: allowance } : {}),
    ...(near !== undefined ? { nearLimitFraction: near } : {}),
  } as LimitRule;
}

const cell = 'min-h-touch w-full rounded-md border border-line bg-card px-2 text-sm aria-[invalid=true]:border-fail';

/**
 * Edit the rules; saving stores a new version. On a refusal (412: someone saved a version first;
 * 422: a rule does not make sense) the rows stay as typed.
 */
export function RulesEditor({
  rules,
  version,
  onSave,
  onCancel,
  onReloadLatest,
}: {
  rules: LimitRule[];
  version: number;
  onSave: (body: UpdateProfileInput) => Promise<unknown>;
  onCancel: () => void;
  onReloadLatest: () => void;
}) {
  const [rows, setRows] = useState<Row[]>(rules.map(toRow));
  const [notes, setNotes] = useState('');
  const [error, setError] = useState<unknown>(null);
  const set = (i: number, patch: Partial<Row>) => setRows(rows.map((r, k) => (k === i ? { ...r, ...patch } : r)));
  const errorsOf = (i: number) => (error instanceof ApiError ? error.errors.filter((e) => e.path.startsWith(`rules.${i}.`) || e.path === `rules.${i}`) : []);
  const invalid = (i: number, field: string) => errorsOf(i).some((e) => e.path === `rules.${i}.${field}`) || undefined;

  return (
    <form
      className="flex flex-col gap-4"
      onSubmit={async (e) => {
        e.preventDefault();
        setError(null);
        try {
          await onSave({ rules: rows.map(toRule), ...(notes.trim() ? { notes: notes.trim() } : {}) });
        } catch (err) {
          setError(err);
        }
      }}
    >
      <div className="overflow-x-auto">
        <table className="w-full min-w-[60rem] text-left text-sm">
          <thead className="border-b border-line bg-paper text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              <th className="px-2 py-2">Equipment</th>
              <th className="px-2 py-2">Test</th>
              <th className="px-2 py-2">Limit</th>
              <th className="px-2 py-2">Value (Ω)</th>
              <th className="px-2 py-2">Near limit</th>
              <th className="px-2 py-2">Source</th>
              <th className="px-2 py-2">House rule</th>
              <th className="px-2 py-2"><span className="sr-only">Remove</span></th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => (
              <tr key={i} className="border-b border-line align-top">
                <td className="px-2 py-2">
                  <select aria-label={`Equipment of rule ${i + 1}`} className={cell} value={r.equipmentKind} onChange={(e) => set(i, { equipmentKind: e.target.value as EquipmentKind, id: `${e.target.value}.${r.testKind}` })}>
                    {EQUIPMENT_KINDS.map((k) => <option key={k} value={k}>{EQUIPMENT_KIND_LABELS[k]}</option>)}
                  </select>
                </td>
                <td className="px-2 py-2">
                  <select aria-label={`Test of rule ${i + 1}`} aria-invalid={invalid(i, 'testKind')} className={cell} value={r.testKind} onChange={(e) => set(i, { testKind: e.target.value as TestKind, id: `${r.equipmentKind}.${e.target.value}`, limitKind: e.target.value === 'insulation' ? 'min' : r.limitKind === 'min' ? 'max' : r.limitKind })}>
                    {TEST_KINDS.map((k) => <option key={k} value={k}>{TEST_KIND_LABELS[k]}</option>)}
                  </select>
                </td>
                <td className="px-2 py-2">
                  <select aria-label={`Limit kind of rule ${i + 1}`} className={cell} value={r.limitKind} onChange={(e) => set(i, { limitKind: e.target.value as LimitKind })}>
                    <option value="max">Maximum</option>
                    <option value="per-metre">Maximum per metre</option>
                    <option value="min">Minimum</option>
                  </select>
                </td>
                <td className="px-2 py-2">
                  <input aria-label={`Value of rule ${i + 1}`} aria-invalid={invalid(i, 'maxOhm') ?? invalid(i, 'minOhm') ?? invalid(i, 'maxOhmPerMetre')} inputMode="decimal" className={cell} value={r.value} onChange={(e) => set(i, { value: e.target.value })} />
                  {r.limitKind === 'per-metre' && (
                    <input aria-label={`Connector allowance of rule ${i + 1}`} placeholder="+ connectors Ω" inputMode="decimal" className={`${cell} mt-1`} value={r.allowance} onChange={(e) => set(i, { allowance: e.target.value })} />
                  )}
                </td>
                <td className="px-2 py-2">
                  <input aria-label={`Near limit of rule ${i + 1}`} placeholder={r.limitKind === 'min' ? 'Ω, e.g. 1000000' : 'fraction, e.g. 0.9'} inputMode="decimal" className={cell} value={r.near} onChange={(e) => set(i, { near: e.target.value })} />
                </td>
                <td className="px-2 py-2">
                  <input aria-label={`Source of rule ${i + 1}`} aria-invalid={invalid(i, 'source')} className={cell} value={r.source} onChange={(e) => set(i, { source: e.target.value })} />
                  {errorsOf(i).map((e) => (
                    <p key={e.path + e.message} role="alert" className="mt-1 text-xs font-medium text-fail">{e.message}</p>
                  ))}
                </td>
                <td className="px-2 py-2 text-center">
                  <input
                    type="checkbox"
                    aria-label={`Rule ${i + 1} is a house rule`}
                    className="size-5 accent-brass"
                    checked={r.houseRule}
                    onChange={(e) => set(i, { houseRule: e.target.checked, source: e.target.checked && !r.source ? HOUSE_RULE_SOURCE : r.source })}
                  />
                </td>
                <td className="px-2 py-2">
                  <Button variant="ghost" aria-label={`Remove rule ${i + 1}`} onClick={() => setRows(rows.filter((_, k) => k !== i))}>×</Button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap gap-2">
        <Button
          variant="secondary"
          onClick={() => setRows([...rows, { id: `other.continuity.${rows.length + 1}`, equipmentKind: 'other', testKind: 'continuity', limitKind: 'max', value: '', allowance: '', near: '0.9', source: HOUSE_RULE_SOURCE, houseRule: true, note: '' }])}
        >
          Add a rule
        </Button>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="f-version-notes" className="text-sm font-medium">What changed (kept with the new version)</label>
        <input id="f-version-notes" className={cell} value={notes} onChange={(e) => setNotes(e.target.value)} />
      </div>
      {error instanceof ApiError && error.status === 412 ? (
        <Notice tone="caution">
          <p className="font-semibold">Changed meanwhile — not saved</p>
          <p>{error.message}</p>
          <p className="mt-1">Your rows are kept here. Open the latest version to compare, then apply your changes there.</p>
          <Button variant="secondary" className="mt-2" onClick={onReloadLatest}>Open the latest version</Button>
        </Notice>
      ) : (
        error instanceof Error && <Notice tone="error">{error.message}</Notice>
      )}
      <div className="flex gap-2">
        <Button type="submit">Save as version {version + 1}</Button>
        <Button variant="secondary" onClick={onCancel}>Cancel</Button>
      </div>
    </form>
  );
}
