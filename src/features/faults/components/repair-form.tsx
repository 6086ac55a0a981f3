import { useState } from 'react';
import { formatLength, lengthUnitSymbol, lengthUnitWord, type LengthSystem } from '@shared/domain/units';
import type { CreateRepairInput, RepairAction } from '@shared/schemas/faults';
import { ApiError } from '@/lib/api-client';
import { siOf, switchUnits, typeText, type UnitTexts } from '@/lib/unit-texts';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import type { FaultDetail } from '../api/get-fault';
import { useAddRepair } from '../api/add-repair';

const ACTIONS: { value: RepairAction; label: string; hint: string }[] = [
  {
    value: 'cut-out',
    label: 'Cut out a section',
    hint: 'The damaged length is cut away and the cable re-joined; its recorded length shrinks.',
  },
  { value: 'connector-remade', label: 'Connector remade', hint: 'A plug or socket was re-soldered or replaced; the length stays.' },
  {
    value: 'swapped',
    label: 'Swap for another item',
    hint: 'Another registered item of the same kind goes in this position; this one goes for repair.',
  },
  { value: 'retired', label: 'Retire the item', hint: 'The item is taken out of service for good and the position is left empty.' },
];

const NO_LENGTH: UnitTexts = { texts: {}, exact: {} };
const REMOVED = 'lengthRemovedM';

/** The cut-out length is typed in the user's unit (m or ft) and sent in metres. */
export function RepairForm({ fault, unitSystem }: { fault: FaultDetail; unitSystem: LengthSystem }) {
  const [action, setAction] = useState<RepairAction>('cut-out');
  const [removed, setRemoved] = useState<UnitTexts>(NO_LENGTH);
  const [seenSystem, setSeenSystem] = useState(unitSystem);
  const [tag, setTag] = useState('');
  const [notes, setNotes] = useState('');
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const repair = useAddRepair(fault.id);
  // Disarmed once a repair is saved (and on a fault already repaired): a second tap on the same
  // button must not record the repair twice. Another repair is a deliberate choice.
  const [armed, setArmed] = useState(fault.status !== 'repaired');

  // Adjusting state while rendering when the person switches m ↔ ft: the typed length is converted.
  if (seenSystem !== unitSystem) {
    setSeenSystem(unitSystem);
    setRemoved((r) => switchUnits(r, { [REMOVED]: 'length' }, seenSystem, unitSystem));
    setFieldErrors({});
  }

  const lengthM = fault.equipment?.lengthM ?? null;
  const removedText = (removed.texts[REMOVED] ?? '').trim();
  const removedM = siOf(removed, REMOVED, 'length', unitSystem);
  const newLength = lengthM !== null && removedM !== null && removedM > 0 ? lengthM - removedM : null;

  if (!armed) {
    return (
      <div className="flex flex-col gap-3" data-testid="repair-disarmed">
        <Notice tone="success">Repair recorded. Now retest the item: every step must pass before the strip is clear.</Notice>
        <div>
          <Button
            variant="secondary"
            onClick={() => {
              repair.reset();
              setArmed(true);
            }}
          >
            Record another repair…
          </Button>
        </div>
      </div>
    );
  }

  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={async (e) => {
        e.preventDefault();
        setFieldErrors({});
        const extra = notes.trim() ? { notes: notes.trim() } : {};
        let body: CreateRepairInput;
        if (action === 'cut-out') {
          const cut = checkCutOut(removedText, removedM, lengthM, unitSystem);
          if (!cut.ok) return setFieldErrors({ lengthRemovedM: cut.message });
          body = { action, lengthRemovedM: cut.removedM, ...extra };
        } else if (action === 'swapped') {
          if (!tag.trim()) return setFieldErrors({ replacementAssetTag: 'The asset tag of the item put in.' });
          body = { action, replacementAssetTag: tag.trim(), ...extra };
        } else {
          body = { action, ...extra };
        }
        try {
          await repair.mutateAsync(body);
          setRemoved(NO_LENGTH);
          setTag('');
          setNotes('');
          setArmed(false);
        } catch (err) {
          if (err instanceof ApiError) setFieldErrors(Object.fromEntries(err.errors.map((x) => [x.path, x.message])));
        }
      }}
    >
      <fieldset>
        <legend className="text-sm font-medium">What was done</legend>
        <div className="mt-2 grid gap-2 sm:grid-cols-2">
          {ACTIONS.map((a) => (
            <label
              key={a.value}
              className={`flex min-h-touch cursor-pointer gap-2 rounded-lg border p-3 text-sm ${action === a.value ? 'border-brand bg-brand-soft' : 'border-line bg-card'}`}
            >
              <input
                type="radio"
                name="action"
                value={a.value}
                checked={action === a.value}
                onChange={() => setAction(a.value)}
                className="mt-0.5 size-4"
              />
              <span>
                <span className="font-semibold">{a.label}</span>
                <span className="block text-xs text-ink-soft">{a.hint}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      {action === 'cut-out' && (
        <div className="flex flex-col gap-1">
          <label htmlFor="rep-length" className="text-sm font-medium">
            Length removed ({lengthUnitSymbol(unitSystem)})
          </label>
          <input
            id="rep-length"
            inputMode="decimal"
            autoComplete="off"
            value={removed.texts[REMOVED] ?? ''}
            onChange={(e) => setRemoved((r) => typeText(r, REMOVED, e.target.value))}
            aria-invalid={fieldErrors.lengthRemovedM ? true : undefined}
            className="min-h-touch w-40 rounded-lg border border-line bg-card px-3 text-base aria-[invalid=true]:border-fail"
          />
          {lengthM !== null && (
            <p className="text-sm" data-testid="new-length">
              {formatLength(lengthM, unitSystem)} now
              {newLength !== null &&
                (newLength > 0 ? ` → ${formatLength(newLength, unitSystem)} after the cut` : ' → nothing left: retire the item instead')}
            </p>
          )}
          {fieldErrors.lengthRemovedM && (
            <p role="alert" className="text-xs font-medium text-fail">
              {fieldErrors.lengthRemovedM}
            </p>
          )}
        </div>
      )}
      {action === 'swapped' && (
        <div className="flex flex-col gap-1">
          <label htmlFor="rep-tag" className="text-sm font-medium">
            Asset tag of the item put in
          </label>
          <input
            id="rep-tag"
            autoComplete="off"
            value={tag}
            onChange={(e) => setTag(e.target.value)}
            aria-invalid={fieldErrors.replacementAssetTag ? true : undefined}
            className="min-h-touch w-48 rounded-lg border border-line bg-card px-3 text-base uppercase aria-[invalid=true]:border-fail"
          />
          {fieldErrors.replacementAssetTag && (
            <p role="alert" className="text-xs font-medium text-fail">
              {fieldErrors.replacementAssetTag}
            </p>
          )}
        </div>
      )}
      <div className="flex flex-col gap-1">
        <label htmlFor="rep-notes" className="text-sm font-medium">
          Notes <span className="font-normal text-ink-soft">— optional</span>
        </label>
        <textarea
          id="rep-notes"
          rows={2}
          value={notes}
          onChange={(e) => setNotes(e.target.value)}
          className="rounded-lg border border-line bg-card px-3 py-2 text-base"
        />
      </div>
      {repair.isError && <Notice tone="error">{repair.error.message}</Notice>}
      <div>
        <Button type="submit" disabled={repair.isPending}>
          {repair.isPending ? 'Saving…' : 'Record the repair'}
        </Button>
      </div>
    </form>
  );
}

/** The typed cut-out in metres, or what is wrong with it worded in the person's units. */
function checkCutOut(
  text: string,
  removedM: number | null,
  lengthM: number | null,
  system: LengthSystem,
): { ok: true; removedM: number } | { ok: false; message: string } {
  const word = lengthUnitWord(system);
  if (text === '') return { ok: false, message: `How much was cut away, in ${word}.` };
  if (removedM === null) return { ok: false, message: `Type a number, in ${word}.` };
  if (!(removedM > 0)) return { ok: false, message: `How much was cut away, in ${word}: more than 0.` };
  if (lengthM !== null && removedM >= lengthM) {
    return { ok: false, message: `Must be less than the item’s ${formatLength(lengthM, system)}; retire the item instead.` };
  }
  return { ok: true, removedM };
}
