import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { Link, useNavigate, useParams } from 'react-router';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { copyProfileSchema } from '@shared/schemas/limit-profile';
import { useMe } from '@/features/auth/api/get-me';
import { useProfile } from '@/features/profiles/api/get-profile';
import { useCopyProfile } from '@/features/profiles/api/copy-profile';
import { useUpdateProfile } from '@/features/profiles/api/update-profile';
import { RulesTable } from '@/features/profiles/components/rules-table';
import { RulesEditor } from '@/features/profiles/components/rules-editor';
import { TemperatureSetting } from '@/features/profiles/components/temperature-setting';
import { Button } from '@/components/ui/button';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { useDates } from '@/lib/date-format';

/** A copy of this version under a new name, as version 1 of a new profile. */
function CopyForm({
  onCopy,
  onCopied,
  error,
}: {
  onCopy: (name: string) => Promise<{ id: string }>;
  onCopied: (id: string) => void;
  error: string | null;
}) {
  const form = useForm<z.input<typeof copyProfileSchema>, unknown, z.output<typeof copyProfileSchema>>({
    resolver: zodResolver(copyProfileSchema),
    defaultValues: { name: '' },
  });
  const name = useWatch({ control: form.control, name: 'name' });
  return (
    <form
      noValidate
      className="mt-2 flex flex-col gap-2"
      onSubmit={form.handleSubmit(async (v) => {
        const created = await onCopy(v.name).catch(() => null);
        if (created) onCopied(created.id);
      })}
    >
      <TextField label="Name of the copy" id="f-copyName" {...form.register('name')} error={form.formState.errors.name?.message} />
      {error && <Notice tone="error">{error}</Notice>}
      <Button type="submit" variant="secondary" disabled={!name.trim()}>
        Copy profile
      </Button>
    </form>
  );
}

export default function ProfilePage() {
  const { profileId = '' } = useParams();
  const me = useMe();
  const navigate = useNavigate();
  const profile = useProfile(profileId);
  const copy = useCopyProfile();
  const update = useUpdateProfile();
  const [editing, setEditing] = useState(false);
  const dates = useDates();
  const canManage = me.data?.role === 'admin' || me.data?.role === 'director';

  if (profile.isPending) return <Loading />;
  if (profile.isError) return <Notice tone="error">{profile.error.message}</Notice>;
  const p = profile.data;
  const isLatest = p.version === p.latestVersion;

  return (
    <>
      <PageHeader
        title={p.name}
        subtitle={
          <>
            Version {p.version} of {p.latestVersion} ·{' '}
            <Link className="text-brand underline" to={paths.profiles}>
              All profiles
            </Link>
          </>
        }
        actions={canManage && isLatest && !editing && <Button onClick={() => setEditing(true)}>Edit rules</Button>}
      />
      {!isLatest && (
        <div className="mb-4">
          <Notice tone="info">
            This is an older version, kept because readings were checked with it.{' '}
            <Link className="font-medium text-brand underline" to={paths.profile(p.latestId)}>
              Open the latest (version {p.latestVersion})
            </Link>
          </Notice>
        </div>
      )}
      <div className={`grid gap-6 ${editing ? '' : 'xl:grid-cols-[3fr_1fr]'}`}>
        <Card className="overflow-x-auto p-0!">
          {editing ? (
            <div className="p-4">
              <RulesEditor
                rules={p.rules}
                version={p.version}
                onCancel={() => setEditing(false)}
                onReloadLatest={() => void profile.refetch()}
                onSave={async (body) => {
                  const saved = await update.mutateAsync({ id: p.id, version: p.latestVersion, body });
                  setEditing(false);
                  navigate(paths.profile(saved.id));
                }}
              />
            </div>
          ) : (
            <RulesTable rules={p.rules} />
          )}
        </Card>
        <div className="flex flex-col gap-4">
          <Card>
            <h2 className="text-lg font-semibold">Checklist</h2>
            <p className="mt-1 text-sm">
              Loop resistance is asked for:{' '}
              {p.loopRequired.length ? p.loopRequired.map((k) => EQUIPMENT_KIND_LABELS[k].toLowerCase()).join(', ') : 'nothing'}.
            </p>
            {p.notes && <p className="mt-2 text-sm text-ink-soft">{p.notes}</p>}
          </Card>
          <Card>
            <h2 className="text-lg font-semibold">Cable temperature</h2>
            <TemperatureSetting
              key={p.id}
              referenceC={p.temperatureReferenceC}
              canEdit={canManage && isLatest && !editing}
              onSave={async ({ temperatureReferenceC }) => {
                const saved = await update.mutateAsync({
                  id: p.id,
                  version: p.latestVersion,
                  body: { rules: p.rules, loopRequired: p.loopRequired, temperatureReferenceC },
                });
                navigate(paths.profile(saved.id));
              }}
            />
          </Card>
          <Card>
            <h2 className="text-lg font-semibold">Versions</h2>
            <ul className="mt-2 text-sm">
              {p.versions.map((v) => (
                <li key={v.id} className="py-1">
                  {v.id === p.id ? (
                    <strong>Version {v.version}</strong>
                  ) : (
                    <Link className="text-brand underline" to={paths.profile(v.id)}>
                      Version {v.version}
                    </Link>
                  )}
                  <span className="text-ink-soft">
                    {' '}
                    · {dates.date(v.createdAt)}
                    {v.byName ? ` · ${v.byName}` : ''}
                  </span>
                </li>
              ))}
            </ul>
          </Card>
          {p.usedBy.length > 0 && (
            <Card>
              <h2 className="text-lg font-semibold">Used by</h2>
              <ul className="mt-2 text-sm">
                {p.usedBy.map((u) => (
                  <li key={u.venueId} className="py-1">
                    <Link className="text-brand underline" to={paths.venuePlan(u.venueId)}>
                      {u.venueName}
                    </Link>{' '}
                    ({u.eventName}) · version {u.version}
                  </li>
                ))}
              </ul>
            </Card>
          )}
          {canManage && (
            <Card>
              <h2 className="text-lg font-semibold">Make a copy</h2>
              <CopyForm
                onCopy={(name) => copy.mutateAsync({ id: p.id, name })}
                error={copy.isError ? copy.error.message : null}
                onCopied={(id) => navigate(paths.profile(id))}
              />
            </Card>
          )}
        </div>
      </div>
    </>
  );
}
