import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { EQUIPMENT_STATUS_LABELS, EQUIPMENT_STATUSES, updateEquipmentSchema, type UpdateEquipmentInput } from '@shared/schemas/equipment';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { showServerErrors } from '@/lib/form-errors';
import { decimalOrNull, keepTyped, textOrNull } from '@/lib/form-values';
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
  const values = useMemo(
    () => ({ description: item.description, lengthM: item.lengthM, cableType: item.cableType, status: item.status, notes: item.notes }),
    [item],
  );
  const form = useForm<UpdateEquipmentInput, unknown, z.output<typeof updateEquipmentSchema>>({
    resolver: zodResolver(updateEquipmentSchema),
    values,
    resetOptions: keepTyped,
  });
  const errors = form.formState.errors;
  const root = errors.root;

  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={form.handleSubmit(async (patch) => {
        try {
          await onSave({ version: item.version, patch });
        } catch (err) {
          showServerErrors(form.setError, err, 'Could not save.');
        }
      })}
    >
      <TextField label="Description" {...form.register('description')} error={errors.description?.message} />
      <div className="grid grid-cols-2 gap-3">
        <TextField
          label="Recorded length (m)"
          inputMode="decimal"
          {...form.register('lengthM', { setValueAs: decimalOrNull })}
          error={errors.lengthM?.message}
        />
        <SelectField label="Status" {...form.register('status')}>
          {EQUIPMENT_STATUSES.map((s) => (
            <option key={s} value={s}>
              {EQUIPMENT_STATUS_LABELS[s]}
            </option>
          ))}
        </SelectField>
      </div>
      <TextField label="Cable type" {...form.register('cableType', { setValueAs: textOrNull })} error={errors.cableType?.message} />
      <TextField label="Notes" {...form.register('notes', { setValueAs: textOrNull })} error={errors.notes?.message} />
      {root?.type === '412' ? (
        <Notice tone="caution">
          <p className="font-semibold">Changed meanwhile</p>
          <p>{root.message}</p>
          <Button variant="secondary" className="mt-2" onClick={onReload}>
            Load the current version
          </Button>
        </Notice>
      ) : (
        root && <Notice tone="error">{root.message}</Notice>
      )}
      {form.formState.isSubmitSuccessful && !root && <Notice tone="success">Saved (version {item.version}).</Notice>}
      <Button type="submit">Save changes</Button>
    </form>
  );
}
