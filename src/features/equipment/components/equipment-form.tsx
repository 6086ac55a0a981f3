import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { EQUIPMENT_KINDS } from '@shared/domain/limits';
import {
  createEquipmentSchema,
  EQUIPMENT_KIND_LABELS,
  EQUIPMENT_STATUS_LABELS,
  EQUIPMENT_STATUSES,
  type CreateEquipmentInput,
} from '@shared/schemas/equipment';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { saveThenReset } from '@/lib/form-errors';
import { numberOrNull } from './labels';

/** Register a new item. Field errors from the server (e.g. a duplicate tag) land on their field. */
/** `scannedTag`: a tag read from a label that is not in the register yet, put in the form to register it. */
export function EquipmentCreateForm({
  onCreate,
  scannedTag,
}: {
  onCreate: (v: CreateEquipmentInput) => Promise<unknown>;
  scannedTag?: string;
}) {
  const form = useForm<CreateEquipmentInput>({
    resolver: zodResolver(createEquipmentSchema),
    defaultValues: {
      assetTag: '',
      kind: 'floor-cable',
      description: '',
      lengthM: null,
      conductorMm2: null,
      cableType: null,
      status: 'in-service',
    },
  });
  useEffect(() => {
    if (!scannedTag) return;
    form.setValue('assetTag', scannedTag, { shouldDirty: true });
    form.setFocus('kind');
  }, [scannedTag, form]);
  const errors = form.formState.errors;
  const root = errors.root?.message;
  return (
    <form noValidate className="flex flex-col gap-3" onSubmit={form.handleSubmit(saveThenReset(form, onCreate, 'Could not save.'))}>
      <TextField
        label="Asset tag"
        hint="As written on the item's label, for example FC-025."
        autoComplete="off"
        {...form.register('assetTag')}
        error={errors.assetTag?.message}
      />
      <SelectField label="Kind" {...form.register('kind')} error={errors.kind?.message}>
        {EQUIPMENT_KINDS.map((k) => (
          <option key={k} value={k}>
            {EQUIPMENT_KIND_LABELS[k]}
          </option>
        ))}
      </SelectField>
      <TextField label="Description" {...form.register('description')} error={errors.description?.message} />
      <div className="grid grid-cols-2 gap-3">
        <TextField
          label="Length (m)"
          inputMode="decimal"
          {...form.register('lengthM', { setValueAs: numberOrNull })}
          error={errors.lengthM?.message}
        />
        <TextField
          label="Conductor (mm²)"
          inputMode="decimal"
          {...form.register('conductorMm2', { setValueAs: numberOrNull })}
          error={errors.conductorMm2?.message}
        />
      </div>
      <TextField
        label="Cable type"
        {...form.register('cableType', { setValueAs: (v) => (v ? v : null) })}
        error={errors.cableType?.message}
      />
      <SelectField label="Status" {...form.register('status')}>
        {EQUIPMENT_STATUSES.map((s) => (
          <option key={s} value={s}>
            {EQUIPMENT_STATUS_LABELS[s]}
          </option>
        ))}
      </SelectField>
      {root && <Notice tone="error">{root}</Notice>}
      {form.formState.isSubmitSuccessful && !root && <Notice tone="success">Item added to the register.</Notice>}
      <Button type="submit" disabled={form.formState.isSubmitting}>
        Add to register
      </Button>
    </form>
  );
}
