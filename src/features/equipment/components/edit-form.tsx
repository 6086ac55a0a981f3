import { useState } from 'react';
import { EQUIPMENT_STATUS_LABELS, EQUIPMENT_STATUSES, type UpdateEquipmentInput } from '@shared/schemas/equipment';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { ApiError } from '@/lib/api-client';
import { fieldErrorOf } from '@/lib/form-errors';
import type { EquipmentItem } from '../api/types';

/**
 * Edits the register record. What the person typed stays in the form when the save is refused
 * (e.g. someone else saved first: 412), so it can be applied again after reloading.
 */
export function EquipmentEditForm({
  item,
  onSave,
  onReload,
}: {
  item: EquipmentItem;
  onSave: (v: { version: number; patch: UpdateEquipmentInput }) => Promise<unknown>;
  onReload: () => void;
}) {
  const [draft, setDraft] = useState({
    description: item.description,
    lengthM: item.lengthM?.toString() ?? '',
    cableType: item.cableType ?? '',
    status: item.status,
    notes: item.notes ?? '',
  });
  const [error, setError] = useState<ApiError | Error | null>(null);
  const [saved, setSaved] = useState(false);
  const set = (k: keyof typeof draft) => (e: { target: { value: string } }) => setDraft({ ...draft, [k]: e.target.value });
  const fieldError = (p: string) => fieldErrorOf(error, p);

  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={async (e) => {
        e.preventDefault();
        setError(null);
        setSaved(false);
        try {
          await onSave({
            version: item.version,
            patch: {
              description: draft.description,
              lengthM: draft.lengthM.trim() === '' ? null : Number(draft.lengthM.replace(',', '.')),
              cableType: draft.cableType || null,
              status: draft.status,
              notes: draft.notes || null,
            },
          });
          setSaved(true);
        } catch (err) {
          setError(err as Error);
        }
      }}
    >
      <TextField label="Description" name="description" value={draft.description} onChange={set('description')} error={fieldError('description')} />
      <div className="grid grid-cols-2 gap-3">
        <TextField label="Recorded length (m)" name="lengthM" inputMode="decimal" value={draft.lengthM} onChange={set('lengthM')} error={fieldError('lengthM')} />
        <SelectField label="Status" name="status" value={draft.status} onChange={set('status')}>
          {EQUIPMENT_STATUSES.map((s) => (
            <option key={s} value={s}>{EQUIPMENT_STATUS_LABELS[s]}</option>
          ))}
        </SelectField>
      </div>
      <TextField label="Cable type" name="cableType" value={draft.cableType} onChange={set('cableType')} />
      <TextField label="Notes" name="notes" value={draft.notes} onChange={set('notes')} />
      {error instanceof ApiError && error.status === 412 ? (
        <Notice tone="caution">
          <p className="font-semibold">Changed meanwhile</p>
          <p>{error.message}</p>
          <Button variant="secondary" className="mt-2" onClick={onReload}>Load the current version</Button>
        </Notice>
      ) : (
        error && <Notice tone="error">{error.message}</Notice>
      )}
      {saved && <Notice tone="success">Saved (version {item.version}).</Notice>}
      <Button type="submit">Save changes</Button>
    </form>
  );
}
