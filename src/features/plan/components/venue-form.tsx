import { useState } from 'react';
import type { CreateVenueInput } from '@shared/schemas/plan';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { SelectField, TextField } from '@/components/ui/field';
import { fieldErrorOf } from '@/lib/form-errors';
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
  const [name, setName] = useState('');
  const [profileId, setProfileId] = useState('');
  const [cloneFrom, setCloneFrom] = useState('');
  const [copyTechnicians, setCopyTechnicians] = useState(false);
  const [error, setError] = useState<unknown>(null);
  const chosenProfile = profileId || profiles[0]?.versions[0]?.id || '';
  const fieldError = (p: string) => fieldErrorOf(error, p);
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={async (e) => {
        e.preventDefault();
        setError(null);
        try {
          await onCreate({ name, profileId: chosenProfile, cloneFromVenueId: cloneFrom || null, copyTechnicians: !!cloneFrom && copyTechnicians });
          setName('');
          setCloneFrom('');
        } catch (err) {
          setError(err);
        }
      }}
    >
      <TextField label="Venue name" name="newVenueName" value={name} onChange={(e) => setName(e.target.value)} error={fieldError('name')} />
      <SelectField label="Limit profile" name="newVenueProfile" value={chosenProfile} onChange={(e) => setProfileId(e.target.value)} error={fieldError('profileId')}>
        {profiles.map((p) => (
          <option key={p.versions[0].id} value={p.versions[0].id}>
            {p.name} — version {p.versions[0].version}
          </option>
        ))}
      </SelectField>
      <SelectField label="Start from" name="cloneFrom" value={cloneFrom} onChange={(e) => setCloneFrom(e.target.value)}>
        <option value="">An empty plan</option>
        {cloneSources.map((v) => (
          <option key={v.id} value={v.id}>
            A copy of {v.name} ({v.eventName})
          </option>
        ))}
      </SelectField>
      {cloneFrom && (
        <label className="flex min-h-touch items-center gap-3">
          <input type="checkbox" className="size-5 accent-brand" checked={copyTechnicians} onChange={(e) => setCopyTechnicians(e.target.checked)} />
          Assign the same technicians
        </label>
      )}
      {error instanceof Error && <Notice tone="error">{error.message}</Notice>}
      <Button type="submit">Add venue</Button>
    </form>
  );
}
