import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
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
  const [draft, setDraft] = useState<{ name?: string; profileId?: string }>({});
  const name = draft.name ?? plan.venue.name;
  const profileId = draft.profileId ?? plan.venue.profileId;
  const newer = plan.profile.latestVersion > plan.profile.version;
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={async (e) => {
        e.preventDefault();
        const ok = await onSave({
          ...(name !== plan.venue.name ? { name } : {}),
          ...(profileId !== plan.venue.profileId ? { profileId } : {}),
        });
        if (ok) setDraft({});
      }}
    >
      <TextField label="Venue name" name="venueName" value={name} disabled={readOnly} onChange={(e) => setDraft({ ...draft, name: e.target.value })} />
      <SelectField label="Limit profile" name="profileId" value={profileId} disabled={readOnly} onChange={(e) => setDraft({ ...draft, profileId: e.target.value })}>
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
