import { useMemo } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { updateVenueSchema, type UpdateVenueInput } from '@shared/schemas/plan';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { keepTyped } from '@/lib/form-values';
import type { VenuePlan } from '../api/types';

export interface ProfileChoice {
  name: string;
  lineageId: string;
  versions: { id: string; version: number }[];
}

export function VenueDetailsForm({
  plan,
  profiles,
  readOnly,
  onSave,
}: {
  plan: VenuePlan;
  profiles: ProfileChoice[];
  readOnly: boolean;
  onSave: (v: { name?: string; profileId?: string }) => Promise<boolean>;
}) {
  // The form shows the plan as loaded; only what the person typed is kept when the plan reloads.
  const values = useMemo(() => ({ name: plan.venue.name, profileId: plan.venue.profileId }), [plan.venue.name, plan.venue.profileId]);
  const form = useForm<UpdateVenueInput, unknown, z.output<typeof updateVenueSchema>>({ resolver: zodResolver(updateVenueSchema), values, resetOptions: keepTyped });
  const [name, profileId] = useWatch({ control: form.control, name: ['name', 'profileId'] });
  const newer = plan.profile.latestVersion > plan.profile.version;
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={form.handleSubmit(async (v) => {
        const patch = {
          ...(v.name !== undefined && v.name !== plan.venue.name ? { name: v.name } : {}),
          ...(v.profileId !== undefined && v.profileId !== plan.venue.profileId ? { profileId: v.profileId } : {}),
        };
        if (await onSave(patch)) form.reset({ name: patch.name ?? plan.venue.name, profileId: patch.profileId ?? plan.venue.profileId });
      })}
    >
      <TextField label="Venue name" id="f-venueName" disabled={readOnly} {...form.register('name')} error={form.formState.errors.name?.message} />
      <SelectField label="Limit profile" disabled={readOnly} {...form.register('profileId')} error={form.formState.errors.profileId?.message}>
        {profiles.flatMap((p) =>
          p.versions.map((v) => (
            <option key={v.id} value={v.id}>
              {p.name} v{v.version}
            </option>
          )),
        )}
      </SelectField>
      {newer && (
        <p className="text-sm text-near">
          “{plan.profile.name}” has a newer version ({plan.profile.latestVersion}). Readings already taken keep version {plan.profile.version}.
        </p>
      )}
      {!readOnly && (
        <Button type="submit" variant="secondary" disabled={name === plan.venue.name && profileId === plan.venue.profileId}>
          Save venue details
        </Button>
      )}
    </form>
  );
}
