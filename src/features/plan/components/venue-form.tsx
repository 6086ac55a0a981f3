import { useMemo } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { createVenueSchema, type CreateVenueInput } from '@shared/schemas/plan';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { showServerErrors } from '@/lib/form-errors';
import { keepTyped, textOrNull } from '@/lib/form-values';
import type { ProfileChoice } from './venue-details-form';

/** A new venue of the event, empty or cloned from an earlier venue (strips, positions, items, steps; no readings). */
export function VenueForm({
  profiles,
  cloneSources,
  onCreate,
}: {
  profiles: ProfileChoice[];
  cloneSources: { id: string; name: string; eventName: string }[];
  onCreate: (v: CreateVenueInput) => Promise<unknown>;
}) {
  // The first profile is chosen until the person picks one (the list arrives after the form).
  const firstProfile = profiles[0]?.versions[0]?.id ?? '';
  const values = useMemo(() => ({ name: '', profileId: firstProfile, cloneFromVenueId: null, copyTechnicians: false }), [firstProfile]);
  const form = useForm<CreateVenueInput, unknown, z.output<typeof createVenueSchema>>({
    resolver: zodResolver(createVenueSchema),
    values,
    resetOptions: keepTyped,
  });
  const errors = form.formState.errors;
  const cloneFrom = useWatch({ control: form.control, name: 'cloneFromVenueId' });
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={form.handleSubmit(async (v) => {
        try {
          await onCreate({ ...v, copyTechnicians: !!v.cloneFromVenueId && !!v.copyTechnicians });
          form.reset(values);
        } catch (err) {
          showServerErrors(form.setError, err, 'Could not add the venue.');
        }
      })}
    >
      <TextField label="Venue name" id="f-newVenueName" {...form.register('name')} error={errors.name?.message} />
      <SelectField label="Limit profile" id="f-newVenueProfile" {...form.register('profileId')} error={errors.profileId?.message}>
        {profiles.map((p) => (
          <option key={p.versions[0].id} value={p.versions[0].id}>
            {p.name} — version {p.versions[0].version}
          </option>
        ))}
      </SelectField>
      <SelectField label="Start from" id="f-cloneFrom" {...form.register('cloneFromVenueId', { setValueAs: textOrNull })}>
        <option value="">An empty plan</option>
        {cloneSources.map((v) => (
          <option key={v.id} value={v.id}>
            A copy of {v.name} ({v.eventName})
          </option>
        ))}
      </SelectField>
      {cloneFrom && (
        <label className="flex min-h-touch items-center gap-3">
          <input type="checkbox" className="size-5 accent-brand" {...form.register('copyTechnicians')} />
          Assign the same technicians
        </label>
      )}
      {errors.root?.message && <Notice tone="error">{errors.root.message}</Notice>}
      <Button type="submit">Add venue</Button>
    </form>
  );
}
