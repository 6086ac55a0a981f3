import { useState } from 'react';
import { stepsForKind, TEST_KIND_LABELS } from '@shared/domain/checklist';
import { EQUIPMENT_KINDS, TEST_KINDS, type EquipmentKind, type TestKind } from '@shared/domain/limits';
import { addPositionSchema, CONDUCTORS_FOR_TEST, type AddPositionInput, type AddStepInput, type UpdateStripInput } from '@shared/schemas/plan';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { StatusMark } from '@/components/ui/status-mark';
import type { PlanPosition, PlanStrip } from '../api/types';

export interface StripEditorActions {
  updateStrip: (patch: UpdateStripInput) => Promise<boolean>;
  withdraw: (reason: string) => Promise<boolean>;
  reinstate: () => Promise<boolean>;
  attach: (positionId: string, assetTag: string | null) => Promise<boolean>;
  addStep: (positionId: string, step: AddStepInput) => Promise<boolean>;
  dropStep: (stepId: string) => Promise<boolean>;
  addPosition: (position: AddPositionInput) => Promise<boolean>;
  removePosition: (positionId: string) => Promise<boolean>;
}

function StripDetails({ strip, readOnly, actions }: { strip: PlanStrip; readOnly: boolean; actions: StripEditorActions }) {
  // Only what the person typed is held here; untouched fields follow the plan as it reloads.
  const [draft, setDraft] = useState<{ label?: string; zone?: string; conductive?: boolean }>({});
  const label = draft.label ?? strip.label;
  const zone = draft.zone ?? strip.zone ?? '';
  const conductive = draft.conductive ?? strip.conductivePiste;
  const changed = label !== strip.label || zone !== (strip.zone ?? '') || conductive !== strip.conductivePiste;
  return (
    <form
      className="grid items-end gap-3 sm:grid-cols-[1fr_1fr_auto_auto]"
      onSubmit={async (e) => {
        e.preventDefault();
        const patch: UpdateStripInput = {};
        if (label !== strip.label) patch.label = label;
        if (zone !== (strip.zone ?? '')) patch.zone = zone || null;
        if (conductive !== strip.conductivePiste) patch.conductivePiste = conductive;
        if (await actions.updateStrip(patch)) setDraft({});
      }}
    >
      <TextField label="Label" name="stripLabel" value={label} disabled={readOnly} onChange={(e) => setDraft({ ...draft, label: e.target.value })} />
      <TextField label="Row or zone" name="stripZone" value={zone} disabled={readOnly} onChange={(e) => setDraft({ ...draft, zone: e.target.value })} />
      <label className="flex min-h-touch items-center gap-2 text-sm">
        <input type="checkbox" className="size-5 accent-brand" checked={conductive} disabled={readOnly} onChange={(e) => setDraft({ ...draft, conductive: e.target.checked })} />
        Conductive piste
      </label>
      {!readOnly && (
        <Button type="submit" variant="secondary" disabled={!changed}>
          Save strip
        </Button>
      )}
    </form>
  );
}

function Withdrawal({ strip, readOnly, actions }: { strip: PlanStrip; readOnly: boolean; actions: StripEditorActions }) {
  const [reason, setReason] = useState('');
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
      onSubmit={async (e) => {
        e.preventDefault();
        if (await actions.withdraw(reason)) setReason('');
      }}
    >
      <TextField
        className="flex-1"
        label="Withdraw this strip (reason)"
        name="withdrawReason"
        placeholder="e.g. not used this event"
        value={reason}
        onChange={(e) => setReason(e.target.value)}
      />
      <Button type="submit" variant="secondary" disabled={reason.trim().length < 3}>
        Withdraw
      </Button>
      <p className="w-full text-xs text-ink-soft">A withdrawn strip is listed as an exception at sign-off.</p>
    </form>
  );
}

function AddStep({ position, onAdd }: { position: PlanPosition; onAdd: StripEditorActions['addStep'] }) {
  const kinds: TestKind[] = position.equipmentKind === 'piste' ? ['piste-end-to-end', 'piste-earth'] : TEST_KINDS.filter((k) => !k.startsWith('piste'));
  const [testKind, setTestKind] = useState<TestKind>(kinds[0]);
  const [conductors, setConductors] = useState(CONDUCTORS_FOR_TEST[kinds[0]][0]);
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={async (e) => {
        e.preventDefault();
        await onAdd(position.id, { testKind, conductors });
      }}
    >
      <SelectField
        label="Add a step"
        name={`testKind-${position.id}`}
        id={`testKind-${position.id}`}
        value={testKind}
        onChange={(e) => {
          const k = e.target.value as TestKind;
          setTestKind(k);
          setConductors(CONDUCTORS_FOR_TEST[k][0]);
        }}
      >
        {kinds.map((k) => (
          <option key={k} value={k}>{TEST_KIND_LABELS[k]}</option>
        ))}
      </SelectField>
      <SelectField label="Lines" name={`conductors-${position.id}`} id={`conductors-${position.id}`} value={conductors} onChange={(e) => setConductors(e.target.value)}>
        {CONDUCTORS_FOR_TEST[testKind].map((c) => (
          <option key={c} value={c}>{c}</option>
        ))}
      </SelectField>
      <Button type="submit" variant="ghost">Add step</Button>
    </form>
  );
}

/** One more position on this strip; it gets the test steps of its kind, and the item when a tag is given. */
function AddPosition({ strip, loopRequired, onAdd }: { strip: PlanStrip; loopRequired: readonly EquipmentKind[]; onAdd: StripEditorActions['addPosition'] }) {
  const empty = { name: '', equipmentKind: EQUIPMENT_KINDS[0] as EquipmentKind, assetTag: '' };
  const [draft, setDraft] = useState(empty);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const planned = stepsForKind(draft.equipmentKind, { loopRequired: [...loopRequired] });
  const fieldId = (f: string) => `new-position-${f}-${strip.id}`;
  // A field's complaint goes as soon as the person edits that field.
  const edit = (patch: Partial<typeof draft>) => {
    setDraft({ ...draft, ...patch });
    setErrors(Object.fromEntries(Object.entries(errors).filter(([k]) => !(k in patch))));
  };
  return (
    <form
      className="flex flex-col gap-3"
      aria-label={`Add a position to ${strip.label}`}
      onSubmit={async (e) => {
        e.preventDefault();
        const body = { name: draft.name, equipmentKind: draft.equipmentKind, ...(draft.assetTag.trim() ? { assetTag: draft.assetTag } : {}) };
        const checked = addPositionSchema.safeParse(body);
        const taken = strip.positions.find((p) => p.name.trim().toLowerCase() === draft.name.trim().toLowerCase());
        const found: Record<string, string> = {};
        if (!checked.success) for (const issue of checked.error.issues) found[String(issue.path[0])] ??= issue.message;
        if (taken && !found.name) found.name = `${taken.name} is already on ${strip.label}.`;
        setErrors(found);
        if (Object.keys(found).length > 0) return;
        // What was typed stays in the form when the save is refused (a 412 among others).
        if (await onAdd(body)) setDraft(empty);
      }}
    >
      <div className="grid items-start gap-3 sm:grid-cols-[1fr_12rem_10rem]">
        <TextField
          label="Name"
          name={fieldId('name')}
          id={fieldId('name')}
          placeholder="e.g. Spare reel"
          autoComplete="off"
          value={draft.name}
          error={errors.name}
          onChange={(e) => edit({ name: e.target.value })}
        />
        <SelectField
          label="Takes a"
          name={fieldId('kind')}
          id={fieldId('kind')}
          value={draft.equipmentKind}
          onChange={(e) => edit({ equipmentKind: e.target.value as EquipmentKind })}
        >
          {EQUIPMENT_KINDS.map((k) => (
            <option key={k} value={k}>{EQUIPMENT_KIND_LABELS[k]}</option>
          ))}
        </SelectField>
        <TextField
          label="Asset tag (optional)"
          name={fieldId('tag')}
          id={fieldId('tag')}
          placeholder="none"
          autoComplete="off"
          value={draft.assetTag}
          error={errors.assetTag}
          onChange={(e) => edit({ assetTag: e.target.value.toUpperCase() })}
        />
      </div>
      <p className="text-xs text-ink-soft">
        {planned.length > 0
          ? `It gets ${planned.length} test steps: ${planned.map((x) => `${TEST_KIND_LABELS[x.testKind].toLowerCase()} ${x.conductors}`).join(', ')}.`
          : 'This kind gets no test steps of its own; add the steps it needs once it is on the strip.'}{' '}
        A position can be taken off again as long as nothing has been measured on it.
      </p>
      <div>
        <Button type="submit" variant="secondary">Add position</Button>
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
      <Button variant="secondary" onClick={() => setAsking(true)} aria-label={`Remove ${position.name} from the strip`}>
        Remove position
      </Button>
    );
  }
  return (
    <div role="group" aria-label={`Remove ${position.name}?`} className="flex w-full flex-wrap items-center gap-2 rounded-lg border border-fail bg-fail-soft px-3 py-2">
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
  const [typed, setTag] = useState<string | null>(null);
  const tag = typed ?? position.equipment?.assetTag ?? '';
  const active = position.steps.filter((s) => !s.removedAt);
  const dropped = position.steps.length - active.length;
  return (
    <li className="rounded-lg border border-line p-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="min-w-40 flex-1">
          <p className="font-semibold">{position.name}</p>
          <p className="text-xs text-ink-soft">Takes a {EQUIPMENT_KIND_LABELS[position.equipmentKind].toLowerCase()}</p>
        </div>
        <form
          className="flex items-end gap-2"
          onSubmit={async (e) => {
            e.preventDefault();
            if (await actions.attach(position.id, tag.trim() === '' ? null : tag.trim())) setTag(null);
          }}
        >
          <TextField
            label="Asset tag"
            name={`tag-${position.id}`}
            id={`tag-${position.id}`}
            className="w-36"
            autoComplete="off"
            placeholder="none"
            value={tag}
            disabled={readOnly}
            onChange={(e) => setTag(e.target.value.toUpperCase())}
          />
          {!readOnly && (
            <Button type="submit" variant="secondary" disabled={tag.trim() === (position.equipment?.assetTag ?? '')}>
              {tag.trim() === '' && position.equipment ? 'Take off' : 'Attach'}
            </Button>
          )}
        </form>
        {!readOnly && !position.tested && <RemovePosition position={position} onRemove={actions.removePosition} />}
      </div>
      {position.equipment && (
        <p className="mt-1 text-xs text-ink-soft">
          {position.equipment.assetTag}: {position.equipment.description || EQUIPMENT_KIND_LABELS[position.equipment.kind]}
        </p>
      )}
      <ul className="mt-3 flex flex-wrap gap-2" aria-label={`Steps for ${position.name}`}>
        {active.length === 0 && <li className="text-sm text-ink-soft">No test steps for this position.</li>}
        {active.map((s) => (
          <li key={s.id} className={`inline-flex items-center gap-1 rounded-full border py-0.5 pl-3 text-sm ${s.addedByDirector ? 'border-brass bg-brass-soft' : 'border-line bg-paper'} ${readOnly ? 'pr-3' : 'pr-0.5'}`}>
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
  loopRequired = [],
}: {
  strip: PlanStrip;
  readOnly: boolean;
  actions: StripEditorActions;
  /** The venue profile's kinds that get a loop step, to say which steps a new position gets. */
  loopRequired?: readonly EquipmentKind[];
}) {
  return (
    <div className="flex flex-col gap-4">
      <StripDetails strip={strip} readOnly={readOnly} actions={actions} />
      <Withdrawal strip={strip} readOnly={readOnly} actions={actions} />
      <ul className="flex flex-col gap-3">
        {strip.positions.map((p) => (
          <PositionCard key={p.id} position={p} readOnly={readOnly} actions={actions} />
        ))}
      </ul>
      {!readOnly && !strip.withdrawnAt && (
        <details className="rounded-lg border border-dashed border-line p-4">
          <summary className="inline-flex min-h-touch cursor-pointer items-center font-medium text-brand">Add a position to {strip.label}…</summary>
          <div className="mt-2">
            <AddPosition strip={strip} loopRequired={loopRequired} onAdd={actions.addPosition} />
          </div>
        </details>
      )}
    </div>
  );
}
