import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { createEventSchema, type CreateEventInput } from '@shared/schemas/plan';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { saveThenReset } from '@/lib/form-errors';
import type { PlanningPeople } from '../api/types';

export function EventForm({
  organisers,
  onCreate,
}: {
  organisers: PlanningPeople['organisers'];
  onCreate: (v: CreateEventInput) => Promise<unknown>;
}) {
  const form = useForm<CreateEventInput>({
    resolver: zodResolver(createEventSchema),
    defaultValues: { name: '', startsOn: '', endsOn: '', organiserId: null },
  });
  const errors = form.formState.errors;
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={form.handleSubmit(saveThenReset(form, onCreate, 'Could not create the event.'))}
    >
      <TextField label="Event name" {...form.register('name')} error={errors.name?.message} />
      <div className="grid grid-cols-2 gap-3">
        <TextField label="Starts on" type="date" {...form.register('startsOn')} error={errors.startsOn?.message} />
        <TextField label="Ends on" type="date" {...form.register('endsOn')} error={errors.endsOn?.message} />
      </div>
      <SelectField
        label="Organiser"
        {...form.register('organiserId', { setValueAs: (v) => (v ? v : null) })}
        error={errors.organiserId?.message}
      >
        <option value="">Not yet chosen</option>
        {organisers.map((o) => (
          <option key={o.id} value={o.id}>
            {o.name}
          </option>
        ))}
      </SelectField>
      {errors.root?.message && <Notice tone="error">{errors.root.message}</Notice>}
      <p className="text-xs text-ink-soft">You will be the technical director of the event.</p>
      <Button type="submit" disabled={form.formState.isSubmitting}>
        Create event
      </Button>
    </form>
  );
}
