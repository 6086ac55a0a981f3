import { useCallback, useEffect, useMemo, useRef, useState, type RefObject } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { stepsForKind, TEST_KIND_LABELS } from '@shared/domain/checklist';
import { EQUIPMENT_KINDS, TEST_KINDS, type EquipmentKind, type TestKind } from '@shared/domain/limits';
import {
  addPositionSchema,
  addStepSchema,
  CONDUCTORS_FOR_TEST,
  updateStripSchema,
  withdrawStripSchema,
  type AddPositionInput,
  type AddStepInput,
  type UpdateStripInput,
} from '@shared/schemas/plan';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { StatusMark } from '@/components/ui/status-mark';
import { bodyResolver } from '@/lib/form-resolver';
import { keepTyped, typedUpperCase } from '@/lib/form-values';
import type { PlanPosition, PlanStrip } from '../api/types';
import { AssetTagsForm, type FieldProblem, type TagsHandle } from './asset-tags-form';

export interface StripEditorActions {
  /** The card's one save: details and asset tags in one edit; a refusal answers the messages by field. */
  updateStrip: (patch: UpdateStripInput) => Promise<true | FieldProblem[]>;
  withdraw: (reason: string) => Promise<boolean>;
  reinstate: () => Promise<boolean>;
  addStep: (positionId: string, step: AddStepInput) => Promise<boolean>;
  dropStep: (stepId: string) => Promise<boolean>;
  addPosition: (position: AddPositionInput) => Promise<boolean>;
  removePosition: (positionId: string) => Promise<boolean>;
}

type StripForm = { label: string; zone: string; conductivePiste: boolean };

/**
 * The strip's details; its form is the card's one save, which also sends the asset-tag table's
 * changed rows (`tags`) in the same edit. The Save button sits at the card's foot (form attribute).
 */
function StripDetails({
  strip,
  readOnly,
  actions,
  formId,
  tags,
  onDirty,
}: {
  strip: PlanStrip;
  readOnly: boolean;
  actions: StripEditorActions;
  formId: string;
  tags: RefObject<TagsHandle | null>;
  onDirty: (dirty: boolean) => void;
}) {
  // The form shows the strip as loaded; only what the person typed is kept when the plan reloads.
  const values = useMemo(
    () => ({ label: strip.label, zone: strip.zone ?? '', conductivePiste: strip.conductivePiste }),
    [strip.label, strip.zone, strip.conductivePiste],
  );
  const form = useForm<StripForm, unknown, z.output<typeof updateStripSchema>>({
    resolver: bodyResolver(updateStripSchema, (v: StripForm) => v),
    values,
    resetOptions: keepTyped,
  });
  const [label, zone, conductive] = useWatch({ control: form.control, name: ['label', 'zone', 'conductivePiste'] });
  const changed = label !== strip.label || zone !== (strip.zone ?? '') || conductive !== strip.conductivePiste;
  useEffect(() => onDirty(changed), [changed, onDirty]);
  const errors = form.formState.errors;
  return (
    <form
      id={formId}
      noValidate
      className="grid items-start gap-3 sm:grid-cols-[1fr_1fr_auto]"
      onSubmit={form.handleSubmit(async (v) => {
        const rows = tags.current ? await tags.current.collect() : [];
        if (rows === null) return; // the table shows what to fix
        const patch: UpdateStripInput = {};
        if (v.label !== undefined && v.label !== strip.label) patch.label = v.label;
        if ((v.zone ?? '') !== (strip.zone ?? '')) patch.zone = v.zone || null;
        if (v.conductivePiste !== undefined && v.conductivePiste !== strip.conductivePiste) patch.conductivePiste = v.conductivePiste;
        if (rows.length > 0) patch.assetTags = rows;
        if (Object.keys(patch).length === 0) return;
        const answer = await actions.updateStrip(patch);
        if (answer === true) {
          form.reset({
            label: patch.label ?? strip.label,
            zone: patch.zone === undefined ? (strip.zone ?? '') : (patch.zone ?? ''),
            conductivePiste: patch.conductivePiste ?? strip.conductivePiste,
          });
          return;
        }
        tags.current?.showProblems(
          answer.filter((p) => p.path.startsWith('assetTags.')),
          rows,
        );
        for (const p of answer) if (p.path === 'label' || p.path === 'zone') form.setError(p.path, { type: 'server', message: p.message });
      })}
    >
      <TextField label="Label" id="f-stripLabel" disabled={readOnly} {...form.register('label')} error={errors.label?.message} />
      <TextField
        label="Row or zone"
        id="f-stripZone"
        hint={readOnly ? undefined : 'Leave it empty when the strip is in no row.'}
        disabled={readOnly}
        {...form.register('zone')}
        error={errors.zone?.message}
      />
      <label className="flex min-h-touch items-center gap-2 self-end text-sm">
        <input type="checkbox" className="size-5 accent-brand" disabled={readOnly} {...form.register('conductivePiste')} />
        Conductive piste
      </label>
    </form>
  );
}

function Withdrawal({ strip, readOnly, actions }: { strip: PlanStrip; readOnly: boolean; actions: StripEditorActions }) {
  const form = useForm<z.input<typeof withdrawStripSchema>, unknown, z.output<typeof withdrawStripSchema>>({
    resolver: zodResolver(withdrawStripSchema),
    defaultValues: { reason: '' },
  });
  const reason = useWatch({ control: form.control, name: 'reason' });
  if (strip.withdrawnAt) {
    return (
      <div className="flex flex-wrap items-center gap-3 rounded-lg border border-line bg-idle-soft px-4 py-2">
        <StatusMark shape="dash" tone="idle" label="Withdrawn" size="sm" />
        <span className="flex-1 text-sm">Reason: {strip.withdrawnReason}</span>
        {!readOnly && (
          <Button variant="secondary" onClick={() => actions.reinstate()}>
            Reinstate strip
          </Button>
        )}
      </div>
    );
  }
  if (readOnly) return null;
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      noValidate
      onSubmit={form.handleSubmit(async (v) => {
        if (await actions.withdraw(v.reason)) form.reset();
      })}
    >
      <TextField
        className="flex-1"
        label="Withdraw this strip (reason)"
        id="f-withdrawReason"
        hint="For example: not used at this event. A withdrawn strip is listed as an exception at sign-off."
        {...form.register('reason')}
        error={form.formState.errors.reason?.message}
      />
      <Button type="submit" variant="secondary" disabled={!withdrawStripSchema.safeParse({ reason }).success}>
        Withdraw
      </Button>
    </form>
  );
}

function AddStep({ position, onAdd }: { position: PlanPosition; onAdd: StripEditorActions['addStep'] }) {
  const kinds: TestKind[] =
    position.equipmentKind === 'piste' ? ['piste-end-to-end', 'piste-earth'] : TEST_KINDS.filter((k) => !k.startsWith('piste'));
  const form = useForm<AddStepInput, unknown, z.output<typeof addStepSchema>>({
    resolver: zodResolver(addStepSchema),
    defaultValues: { testKind: kinds[0], conductors: CONDUCTORS_FOR_TEST[kinds[0]][0] },
  });
  const testKind = useWatch({ control: form.control, name: 'testKind' });
  return (
    <form
      noValidate
      className="flex flex-wrap items-end gap-2"
      onSubmit={form.handleSubmit(async (step) => {
        await onAdd(position.id, step);
      })}
    >
      <SelectField
        label="Add a step"
        id={`testKind-${position.id}`}
        {...form.register('testKind', {
          // The lines a step names depend on its test: start from the first that fits.
          onChange: (e) => form.setValue('conductors', CONDUCTORS_FOR_TEST[e.target.value as TestKind][0]),
        })}
        error={form.formState.errors.testKind?.message}
      >
        {kinds.map((k) => (
          <option key={k} value={k}>
            {TEST_KIND_LABELS[k]}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Lines"
        id={`conductors-${position.id}`}
        {...form.register('conductors')}
        error={form.formState.errors.conductors?.message}
      >
        {CONDUCTORS_FOR_TEST[testKind].map((c) => (
          <option key={c} value={c}>
            {c}
          </option>
        ))}
      </SelectField>
      <Button type="submit" variant="ghost">
        Add step
      </Button>
    </form>
  );
}

/** One more position on this strip; it gets the test steps of its kind, and the item when a tag is given. */
function AddPosition({
  strip,
  loopRequired,
  onAdd,
}: {
  strip: PlanStrip;
  loopRequired: readonly EquipmentKind[];
  onAdd: StripEditorActions['addPosition'];
}) {
  type PositionForm = { name: string; equipmentKind: EquipmentKind; assetTag: string };
  const toBody = (v: PositionForm) => ({
    name: v.name,
    equipmentKind: v.equipmentKind,
    ...(v.assetTag.trim() ? { assetTag: v.assetTag } : {}),
  });
  const check = bodyResolver(addPositionSchema, toBody);
  const form = useForm<PositionForm, unknown, z.output<typeof addPositionSchema>>({
    // The shared schema, then one rule only the plan knows: a name is used once per strip.
    resolver: async (values, context, options) => {
      const result = await check(values, context, options);
      const taken = strip.positions.find((p) => p.name.trim().toLowerCase() === values.name.trim().toLowerCase());
      if (!taken || result.errors.name) return result;
      return { values: {}, errors: { ...result.errors, name: { type: 'taken', message: `${taken.name} is already on ${strip.label}.` } } };
    },
    // A field's complaint goes as soon as the person edits that field (see `clear` below).
    reValidateMode: 'onSubmit',
    defaultValues: { name: '', equipmentKind: EQUIPMENT_KINDS[0], assetTag: '' },
  });
  const kind = useWatch({ control: form.control, name: 'equipmentKind' });
  const planned = stepsForKind(kind, { loopRequired: [...loopRequired] });
  const fieldId = (f: string) => `new-position-${f}-${strip.id}`;
  const clear = (name: keyof PositionForm) => ({ onChange: () => form.clearErrors(name) });
  const errors = form.formState.errors;
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      aria-label={`Add a position to ${strip.label}`}
      onSubmit={form.handleSubmit(async (position) => {
        // What was typed stays in the form when the save is refused (a 412 among others).
        if (await onAdd(position)) form.reset();
      })}
    >
      <div className="grid items-start gap-3 sm:grid-cols-[1fr_12rem_10rem]">
        <TextField
          label="Name"
          id={fieldId('name')}
          hint="For example Spare reel."
          autoComplete="off"
          {...form.register('name', clear('name'))}
          error={errors.name?.message}
        />
        <SelectField label="Takes a" id={fieldId('kind')} {...form.register('equipmentKind', clear('equipmentKind'))}>
          {EQUIPMENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {EQUIPMENT_KIND_LABELS[k]}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Asset tag (optional)"
          id={fieldId('tag')}
          hint="Leave empty to add the position without an item."
          autoComplete="off"
          {...typedUpperCase(form.register('assetTag', clear('assetTag')))}
          error={errors.assetTag?.message}
        />
      </div>
      <p className="text-xs text-ink-soft">
        {planned.length > 0
          ? `It gets ${planned.length} test steps: ${planned.map((x) => `${TEST_KIND_LABELS[x.testKind].toLowerCase()} ${x.conductors}`).join(', ')}.`
          : 'This kind gets no test steps of its own; add the steps it needs once it is on the strip.'}{' '}
        A position can be taken off again as long as nothing has been measured on it.
      </p>
      <div>
        <Button type="submit" variant="secondary">
          Add position
        </Button>
      </div>
    </form>
  );
}

/** Take an untested position off the strip, after a second tap that says what goes with it. */
function RemovePosition({ position, onRemove }: { position: PlanPosition; onRemove: StripEditorActions['removePosition'] }) {
  const [asking, setAsking] = useState(false);
  const steps = position.steps.filter((s) => !s.removedAt).length;
  if (!asking) {
    return (
      <Button variant="secondary" onClick={() => setAsking(true)} aria-label={`Remove position: ${position.name}`}>
        Remove position
      </Button>
    );
  }
  return (
    <div
      role="group"
      aria-label={`Remove ${position.name}?`}
      className="flex w-full flex-wrap items-center gap-2 rounded-lg border border-fail bg-fail-soft px-3 py-2"
    >
      <span className="flex-1 text-sm">
        Take {position.name} off this strip{steps > 0 ? ` with its ${steps} test steps` : ''}
        {position.equipment ? `; ${position.equipment.assetTag} comes off with it and stays in the register` : ''}?
      </span>
      <Button variant="danger" onClick={async () => setAsking(!(await onRemove(position.id)))}>
        Yes, remove
      </Button>
      <Button variant="secondary" onClick={() => setAsking(false)}>
        Keep it
      </Button>
    </div>
  );
}

function PositionCard({ position, readOnly, actions }: { position: PlanPosition; readOnly: boolean; actions: StripEditorActions }) {
  const active = position.steps.filter((s) => !s.removedAt);
  const dropped = position.steps.length - active.length;
  return (
    <li className="rounded-lg border border-line p-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="min-w-40 flex-1">
          <p className="font-semibold">{position.name}</p>
          <p className="text-xs text-ink-soft">Takes a {EQUIPMENT_KIND_LABELS[position.equipmentKind].toLowerCase()}</p>
        </div>
        <p className="text-sm">
          {position.equipment ? (
            <>
              Asset tag <span className="font-mono font-semibold">{position.equipment.assetTag}</span>
            </>
          ) : (
            <span className="text-ink-soft">No item in this position yet</span>
          )}
        </p>
        {!readOnly && !position.tested && <RemovePosition position={position} onRemove={actions.removePosition} />}
      </div>
      {position.equipment?.description && <p className="mt-1 text-xs text-ink-soft">{position.equipment.description}</p>}
      <ul className="mt-3 flex flex-wrap gap-2" aria-label={`Steps for ${position.name}`}>
        {active.length === 0 && <li className="text-sm text-ink-soft">No test steps for this position.</li>}
        {active.map((s) => (
          <li
            key={s.id}
            className={`inline-flex items-center gap-1 rounded-full border py-0.5 pl-3 text-sm ${s.addedByDirector ? 'border-brass bg-brass-soft' : 'border-line bg-paper'} ${readOnly ? 'pr-3' : 'pr-0.5'}`}
          >
            {TEST_KIND_LABELS[s.testKind]} {s.conductors}
            {!s.required && <span className="text-xs text-ink-soft">(optional)</span>}
            {!readOnly && (
              <button
                type="button"
                className="inline-flex size-9 items-center justify-center rounded-full text-ink-soft hover:bg-fail-soft hover:text-fail"
                aria-label={`Drop ${TEST_KIND_LABELS[s.testKind]} ${s.conductors} from ${position.name}`}
                onClick={() => actions.dropStep(s.id)}
              >
                ×
              </button>
            )}
          </li>
        ))}
      </ul>
      {dropped > 0 && <p className="mt-1 text-xs text-ink-soft">{dropped} dropped step(s) kept with their readings.</p>}
      {!readOnly && (
        <details className="mt-2">
          <summary className="inline-flex min-h-touch cursor-pointer items-center text-sm font-medium text-brand">Add a step…</summary>
          <AddStep position={position} onAdd={actions.addStep} />
        </details>
      )}
    </li>
  );
}

/** Everything about one strip. Keyed by strip id by the caller so forms start afresh per strip. */
export function StripEditor({
  strip,
  readOnly,
  actions,
  strips,
  loopRequired = [],
}: {
  strip: PlanStrip;
  /** Every strip of the venue: the asset tags can be set for the strip's whole row. */
  strips: PlanStrip[];
  readOnly: boolean;
  actions: StripEditorActions;
  /** The venue profile's kinds that get a loop step, to say which steps a new position gets. */
  loopRequired?: readonly EquipmentKind[];
}) {
  const tags = useRef<TagsHandle | null>(null);
  const [detailsDirty, setDetailsDirty] = useState(false);
  const [tagsDirty, setTagsDirty] = useState(false);
  const onTagsDirty = useCallback((d: boolean) => setTagsDirty(d), []);
  const onDetailsDirty = useCallback((d: boolean) => setDetailsDirty(d), []);
  const formId = `strip-form-${strip.id}`;
  const submit = () => (document.getElementById(formId) as HTMLFormElement | null)?.requestSubmit();
  return (
    <div className="flex flex-col gap-4">
      <StripDetails strip={strip} readOnly={readOnly} actions={actions} formId={formId} tags={tags} onDirty={onDetailsDirty} />
      <Withdrawal strip={strip} readOnly={readOnly} actions={actions} />
      <ul className="flex flex-col gap-3">
        {strip.positions.map((p) => (
          <PositionCard key={p.id} position={p} readOnly={readOnly} actions={actions} />
        ))}
      </ul>
      {!readOnly && (
        <section aria-labelledby={`tags-${strip.id}`} className="rounded-lg border border-line p-4">
          <h3 id={`tags-${strip.id}`} className="mb-2 font-semibold">
            Asset tags
          </h3>
          <AssetTagsForm strip={strip} strips={strips} handle={tags} onSubmit={submit} onDirty={onTagsDirty} />
        </section>
      )}
      {!readOnly && (
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" form={formId} disabled={!detailsDirty && !tagsDirty}>
            Save strip
          </Button>
          <span className="text-sm text-ink-soft">Saves the label, row, piste and asset tags above together.</span>
        </div>
      )}
      {!readOnly && !strip.withdrawnAt && (
        <details className="rounded-lg border border-dashed border-line p-4">
          <summary className="inline-flex min-h-touch cursor-pointer items-center font-medium text-brand">
            Add a position to {strip.label}…
          </summary>
          <div className="mt-2">
            <AddPosition strip={strip} loopRequired={loopRequired} onAdd={actions.addPosition} />
          </div>
        </details>
      )}
    </div>
  );
}
