import { useMemo } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { updateVenueSchema, type UpdateVenueInput } from '@shared/schemas/plan';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { keepTyped } from '@/lib/form-values';
import { timeZoneChoices } from '@shared/format/date-time';
import type { VenuePlan } from '../api/types';

const ZONES = timeZoneChoices();

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
  onSave: (v: { name?: string; profileId?: string; timeZone?: string }) => Promise<boolean>;
}) {
  // The form shows the plan as loaded; only what the person typed is kept when the plan reloads.
  const { name: savedName, profileId: savedProfileId, timeZone: savedZone } = plan.venue;
  const values = useMemo(() => ({ name: savedName, profileId: savedProfileId, timeZone: savedZone }), [savedName, savedProfileId, savedZone]);
  const form = useForm<UpdateVenueInput, unknown, z.output<typeof updateVenueSchema>>({ resolver: zodResolver(updateVenueSchema), values, resetOptions: keepTyped });
  const [name, profileId, timeZone] = useWatch({ control: form.control, name: ['name', 'profileId', 'timeZone'] });
  const newer = plan.profile.latestVersion > plan.profile.version;
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={form.handleSubmit(async (v) => {
        const patch = {
          ...(v.name !== undefined && v.name !== plan.venue.name ? { name: v.name } : {}),
          ...(v.profileId !== undefined && v.profileId !== plan.venue.profileId ? { profileId: v.profileId } : {}),
          ...(v.timeZone !== undefined && v.timeZone !== savedZone ? { timeZone: v.timeZone } : {}),
        };
        if (await onSave(patch)) form.reset({ name: patch.name ?? savedName, profileId: patch.profileId ?? savedProfileId, timeZone: patch.timeZone ?? savedZone });
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
      <SelectField label="Time zone of the hall" disabled={readOnly} {...form.register('timeZone')} error={form.formState.errors.timeZone?.message}>
        {(ZONES.includes(savedZone) ? ZONES : [savedZone, ...ZONES]).map((z) => (
          <option key={z} value={z}>
            {z.replace(/_/g, ' ')}
          </option>
        ))}
      </SelectField>
      <p className="-mt-2 text-sm text-ink-soft">Every time of this venue (screens, exports, e-mails, certificates) is given in this zone.</p>
      {newer && (
        <p className="text-sm text-near">
          “{plan.profile.name}” has a newer version ({plan.profile.latestVersion}). Readings already taken keep version {plan.profile.version}.
        </p>
      )}
      {!readOnly && (
        <Button type="submit" variant="secondary" disabled={name === savedName && profileId === savedProfileId && timeZone === savedZone}>
          Save venue details
        </Button>
      )}
    </form>
  );
}
