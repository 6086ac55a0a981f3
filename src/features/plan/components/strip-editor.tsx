import { useState } from 'react';
import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { TEST_KINDS, type TestKind } from '@shared/domain/limits';
import { CONDUCTORS_FOR_TEST, type AddStepInput, type UpdateStripInput } from '@shared/schemas/plan';
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

/** Everything about one strip. Keyed by strip id and plan version by the caller so forms refresh. */
export function StripEditor({ strip, readOnly, actions }: { strip: PlanStrip; readOnly: boolean; actions: StripEditorActions }) {
  return (
    <div className="flex flex-col gap-4">
      <StripDetails strip={strip} readOnly={readOnly} actions={actions} />
      <Withdrawal strip={strip} readOnly={readOnly} actions={actions} />
      <ul className="flex flex-col gap-3">
        {strip.positions.map((p) => (
          <PositionCard key={p.id} position={p} readOnly={readOnly} actions={actions} />
        ))}
      </ul>
    </div>
  );
}
