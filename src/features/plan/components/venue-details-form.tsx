import { useMemo } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { updateVenueSchema, type UpdateVenueInput } from '@shared/schemas/plan';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { keepTyped } from '@/lib/form-values';
import { timeZoneChoices } from '@shared/format/date-time';
import type { PlanningPeople, VenuePlan } from '../api/types';

const ZONES = timeZoneChoices();

export interface ProfileChoice {
  name: string;
  lineageId: string;
  versions: { id: string; version: number }[];
}

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x) => b.includes(x));

/**
 * The venue's name, limit profile, time zone and technicians in one form with one save (one edit on the
 * server). Without `people` (a role that cannot plan) the technicians are listed, not chosen.
 */
export function VenueDetailsForm({
  plan,
  profiles,
  people,
  readOnly,
  onSave,
}: {
  plan: VenuePlan;
  profiles: ProfileChoice[];
  people: PlanningPeople['technicians'] | undefined;
  readOnly: boolean;
  onSave: (v: UpdateVenueInput) => Promise<boolean>;
}) {
  const assigned = useMemo(() => plan.technicians.map((t) => t.id), [plan.technicians]);
  // The form shows the plan as loaded; only what the person typed is kept when the plan reloads.
  const { name: savedName, profileId: savedProfileId, timeZone: savedZone } = plan.venue;
  const values = useMemo(
    () => ({ name: savedName, profileId: savedProfileId, timeZone: savedZone, technicianIds: assigned }),
    [savedName, savedProfileId, savedZone, assigned],
  );
  const form = useForm<UpdateVenueInput, unknown, z.output<typeof updateVenueSchema>>({
    resolver: zodResolver(updateVenueSchema),
    values,
    resetOptions: keepTyped,
  });
  const [name, profileId, timeZone, chosen = []] = useWatch({
    control: form.control,
    name: ['name', 'profileId', 'timeZone', 'technicianIds'],
  });
  const newer = plan.profile.latestVersion > plan.profile.version;
  const choosing = !readOnly && people !== undefined;
  const changed = name !== savedName || profileId !== savedProfileId || timeZone !== savedZone || (choosing && !sameSet(chosen, assigned));
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={form.handleSubmit(async (v) => {
        const patch: UpdateVenueInput = {
          ...(v.name !== undefined && v.name !== plan.venue.name ? { name: v.name } : {}),
          ...(v.profileId !== undefined && v.profileId !== plan.venue.profileId ? { profileId: v.profileId } : {}),
          ...(v.timeZone !== undefined && v.timeZone !== savedZone ? { timeZone: v.timeZone } : {}),
          ...(choosing && v.technicianIds && !sameSet(v.technicianIds, assigned) ? { technicianIds: v.technicianIds } : {}),
        };
        if (await onSave(patch)) {
          form.reset({
            name: patch.name ?? savedName,
            profileId: patch.profileId ?? savedProfileId,
            timeZone: patch.timeZone ?? savedZone,
            technicianIds: patch.technicianIds ?? assigned,
          });
        }
      })}
    >
      <TextField
        label="Venue name"
        id="f-venueName"
        disabled={readOnly}
        {...form.register('name')}
        error={form.formState.errors.name?.message}
      />
      <SelectField
        label="Limit profile"
        disabled={readOnly}
        {...form.register('profileId')}
        error={form.formState.errors.profileId?.message}
      >
        {profiles.flatMap((p) =>
          p.versions.map((v) => (
            <option key={v.id} value={v.id}>
              {p.name} v{v.version}
            </option>
          )),
        )}
      </SelectField>
      <SelectField
        label="Time zone of the hall"
        disabled={readOnly}
        {...form.register('timeZone')}
        error={form.formState.errors.timeZone?.message}
      >
        {(ZONES.includes(savedZone) ? ZONES : [savedZone, ...ZONES]).map((z) => (
          <option key={z} value={z}>
            {z.replace(/_/g, ' ')}
          </option>
        ))}
      </SelectField>
      <p className="-mt-2 text-sm text-ink-soft">
        Every time of this venue (screens, exports, e-mails, certificates) is given in this zone.
      </p>
      {newer && (
        <p className="text-sm text-near">
          “{plan.profile.name}” has a newer version ({plan.profile.latestVersion}). Readings already taken keep version{' '}
          {plan.profile.version}.
        </p>
      )}
      {choosing ? (
        <fieldset>
          <legend className="mb-1 text-sm font-medium">Technicians who test this venue</legend>
          {people.length === 0 && <p className="text-sm text-ink-soft">Your organisation has no active technicians yet.</p>}
          {people.map((p) => (
            <label key={p.id} className="flex min-h-touch items-center gap-3">
              <input type="checkbox" className="size-5 accent-brand" value={p.id} {...form.register('technicianIds')} />
              <span>
                {p.name} <span className="text-sm text-ink-soft">{p.email}</span>
              </span>
            </label>
          ))}
          {form.formState.errors.technicianIds?.message && (
            <p role="alert" className="text-xs font-medium text-fail">
              {form.formState.errors.technicianIds.message}
            </p>
          )}
        </fieldset>
      ) : (
        <div>
          <p className="mb-1 text-sm font-medium">Technicians who test this venue</p>
          <ul className="text-sm">
            {plan.technicians.length ? (
              plan.technicians.map((t) => <li key={t.id}>{t.name}</li>)
            ) : (
              <li className="text-ink-soft">Nobody assigned yet.</li>
            )}
          </ul>
        </div>
      )}
      {!readOnly && (
        <Button type="submit" variant="secondary" disabled={!changed}>
          Save venue
        </Button>
      )}
    </form>
  );
}
