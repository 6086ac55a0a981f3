import { useMemo } from 'react';
import { FormProvider, get, useFieldArray, useForm, useFormContext, useFormState, useWatch } from 'react-hook-form';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { EQUIPMENT_KINDS, HOUSE_RULE_SOURCE, TEST_KINDS, type EquipmentKind, type LimitRule, type TestKind } from '@shared/domain/limits';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { updateProfileSchema, type UpdateProfileInput } from '@shared/schemas/limit-profile';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { DataTable } from '@/components/ui/data-table';
import { messagesUnder, showServerErrors } from '@/lib/form-errors';
import { bodyResolver } from '@/lib/form-resolver';

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
  const base = {
    id: r.id,
    equipmentKind: r.equipmentKind,
    testKind: r.testKind,
    source: r.source,
    houseRule: r.houseRule,
    ...(r.note ? { note: r.note } : {}),
  };
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

interface RulesForm {
  rules: Row[];
  notes: string;
}
/** What a save sends; the shared schema checks it, so its messages sit at `rules.N.<rule field>`. */
const toBody = (v: RulesForm): UpdateProfileInput => ({ rules: v.rules.map(toRule), ...(v.notes.trim() ? { notes: v.notes.trim() } : {}) });

/** The form's errors under one rule, and whether one of the rule's fields was named. */
function useRuleErrors(i: number) {
  const { errors } = useFormState<RulesForm>();
  const own = get(errors, `rules.${i}`);
  return { messages: messagesUnder(own), invalid: (...fields: string[]) => fields.some((f) => get(own, f)) || undefined };
}

function EquipmentCell({ i }: { i: number }) {
  const { register, getValues, setValue } = useFormContext<RulesForm>();
  return (
    <select
      aria-label={`Equipment of rule ${i + 1}`}
      className={cell}
      {...register(`rules.${i}.equipmentKind`, {
        onChange: (e) => setValue(`rules.${i}.id`, `${e.target.value}.${getValues(`rules.${i}.testKind`)}`),
      })}
    >
      {EQUIPMENT_KINDS.map((k) => (
        <option key={k} value={k}>
          {EQUIPMENT_KIND_LABELS[k]}
        </option>
      ))}
    </select>
  );
}

function TestCell({ i }: { i: number }) {
  const { register, getValues, setValue } = useFormContext<RulesForm>();
  const { invalid } = useRuleErrors(i);
  return (
    <select
      aria-label={`Test of rule ${i + 1}`}
      aria-invalid={invalid('testKind')}
      className={cell}
      {...register(`rules.${i}.testKind`, {
        onChange: (e) => {
          const testKind = e.target.value as TestKind;
          const limitKind = getValues(`rules.${i}.limitKind`);
          setValue(`rules.${i}.id`, `${getValues(`rules.${i}.equipmentKind`)}.${testKind}`);
          // Insulation sets a minimum; every other test a maximum.
          setValue(`rules.${i}.limitKind`, testKind === 'insulation' ? 'min' : limitKind === 'min' ? 'max' : limitKind);
        },
      })}
    >
      {TEST_KINDS.map((k) => (
        <option key={k} value={k}>
          {TEST_KIND_LABELS[k]}
        </option>
      ))}
    </select>
  );
}

function LimitKindCell({ i }: { i: number }) {
  const { register } = useFormContext<RulesForm>();
  return (
    <select aria-label={`Limit kind of rule ${i + 1}`} className={cell} {...register(`rules.${i}.limitKind`)}>
      <option value="max">Maximum</option>
      <option value="per-metre">Maximum per metre</option>
      <option value="min">Minimum</option>
    </select>
  );
}

function ValueCell({ i }: { i: number }) {
  const { register, control } = useFormContext<RulesForm>();
  const limitKind = useWatch({ control, name: `rules.${i}.limitKind` });
  const { invalid } = useRuleErrors(i);
  return (
    <>
      <input
        aria-label={`Value of rule ${i + 1}`}
        aria-invalid={invalid('maxOhm', 'minOhm', 'maxOhmPerMetre')}
        inputMode="decimal"
        className={cell}
        {...register(`rules.${i}.value`)}
      />
      {limitKind === 'per-metre' && (
        <input
          aria-label={`Connector allowance of rule ${i + 1}`}
          placeholder="+ connectors Ω"
          inputMode="decimal"
          className={`${cell} mt-1`}
          {...register(`rules.${i}.allowance`)}
        />
      )}
    </>
  );
}

function NearCell({ i }: { i: number }) {
  const { register, control } = useFormContext<RulesForm>();
  const limitKind = useWatch({ control, name: `rules.${i}.limitKind` });
  return (
    <input
      aria-label={`Near limit of rule ${i + 1}`}
      placeholder={limitKind === 'min' ? 'Ω, e.g. 1000000' : 'fraction, e.g. 0.9'}
      inputMode="decimal"
      className={cell}
      {...register(`rules.${i}.near`)}
    />
  );
}

function SourceCell({ i }: { i: number }) {
  const { register } = useFormContext<RulesForm>();
  const { messages, invalid } = useRuleErrors(i);
  return (
    <>
      <input aria-label={`Source of rule ${i + 1}`} aria-invalid={invalid('source')} className={cell} {...register(`rules.${i}.source`)} />
      {messages.map((m) => (
        <p key={m} role="alert" className="mt-1 text-xs font-medium text-fail">
          {m}
        </p>
      ))}
    </>
  );
}

function HouseRuleCell({ i }: { i: number }) {
  const { register, getValues, setValue } = useFormContext<RulesForm>();
  return (
    <input
      type="checkbox"
      aria-label={`Rule ${i + 1} is a house rule`}
      className="size-5 accent-brass"
      {...register(`rules.${i}.houseRule`, {
        onChange: (e) => {
          if (e.target.checked && !getValues(`rules.${i}.source`)) setValue(`rules.${i}.source`, HOUSE_RULE_SOURCE);
        },
      })}
    />
  );
}

type RowField = Row & { key: string };
const col = createColumnHelper<RowField>();
const editorColumns = (remove: (index: number) => void) => [
  col.display({ id: 'equipment', header: 'Equipment', cell: (c) => <EquipmentCell i={c.row.index} /> }),
  col.display({ id: 'test', header: 'Test', cell: (c) => <TestCell i={c.row.index} /> }),
  col.display({ id: 'limit', header: 'Limit', cell: (c) => <LimitKindCell i={c.row.index} /> }),
  col.display({ id: 'value', header: 'Value (Ω)', cell: (c) => <ValueCell i={c.row.index} /> }),
  col.display({ id: 'near', header: 'Near limit', cell: (c) => <NearCell i={c.row.index} /> }),
  col.display({ id: 'source', header: 'Source', cell: (c) => <SourceCell i={c.row.index} /> }),
  col.display({
    id: 'house',
    header: 'House rule',
    cell: (c) => <HouseRuleCell i={c.row.index} />,
    meta: { cellClassName: 'text-center' },
  }),
  col.display({
    id: 'remove',
    header: () => <span className="sr-only">Remove</span>,
    cell: (c) => (
      <Button variant="ghost" aria-label={`Remove rule ${c.row.index + 1}`} onClick={() => remove(c.row.index)}>
        ×
      </Button>
    ),
  }),
];
const editorLook = {
  table: 'w-full min-w-[60rem] text-left text-sm',
  head: 'border-b border-line bg-paper text-xs uppercase tracking-wide text-ink-soft',
  th: 'px-2 py-2',
  row: 'border-b border-line align-top',
  td: 'px-2 py-2',
};

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
  const form = useForm<RulesForm, unknown, UpdateProfileInput>({
    resolver: bodyResolver(updateProfileSchema, toBody),
    defaultValues: { rules: rules.map(toRow), notes: '' },
  });
  const { fields, append, remove } = useFieldArray({ control: form.control, name: 'rules', keyName: 'key' });
  const columns = useMemo(() => editorColumns(remove), [remove]);
  const table = useReactTable({ data: fields, columns, getCoreRowModel: getCoreRowModel(), getRowId: (f) => f.key });
  const errors = form.formState.errors;
  const root = errors.root;
  // A complaint about the list as a whole (e.g. no rule left).
  const listError = errors.rules?.root?.message ?? errors.rules?.message;

  return (
    <FormProvider {...form}>
      <form
        noValidate
        className="flex flex-col gap-4"
        onSubmit={form.handleSubmit(async (body) => {
          try {
            await onSave(body);
          } catch (err) {
            showServerErrors(form.setError, err, 'The new version was not saved.');
          }
        })}
      >
        <div className="overflow-x-auto">
          <DataTable table={table} look={editorLook} />
        </div>
        <div className="flex flex-wrap gap-2">
          <Button
            variant="secondary"
            onClick={() =>
              append({
                id: `other.continuity.${fields.length + 1}`,
                equipmentKind: 'other',
                testKind: 'continuity',
                limitKind: 'max',
                value: '',
                allowance: '',
                near: '0.9',
                source: HOUSE_RULE_SOURCE,
                houseRule: true,
                note: '',
              })
            }
          >
            Add a rule
          </Button>
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor="f-version-notes" className="text-sm font-medium">
            What changed (kept with the new version)
          </label>
          <input id="f-version-notes" className={cell} {...form.register('notes')} />
        </div>
        {listError && <Notice tone="error">{listError}</Notice>}
        {root?.type === '412' ? (
          <Notice tone="caution">
            <p className="font-semibold">Changed meanwhile — not saved</p>
            <p>{root.message}</p>
            <p className="mt-1">Your rows are kept here. Open the latest version to compare, then apply your changes there.</p>
            <Button variant="secondary" className="mt-2" onClick={onReloadLatest}>
              Open the latest version
            </Button>
          </Notice>
        ) : (
          root && <Notice tone="error">{root.message}</Notice>
        )}
        <div className="flex gap-2">
          <Button type="submit">Save as version {version + 1}</Button>
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}
