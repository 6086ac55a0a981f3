import { Link } from 'react-router';
import { useProfiles } from '@/features/profiles/api/get-profiles';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';

export default function ProfilesPage() {
  const profiles = useProfiles();
  return (
    <>
      <PageHeader
        title="Limit profiles"
        subtitle="The limits readings are checked against. Editing a profile adds a version; readings keep the version they were checked with."
      />
      {profiles.isPending && <Loading />}
      {profiles.isError && <Notice tone="error">{profiles.error.message}</Notice>}
      <div className="grid gap-4 md:grid-cols-2">
        {profiles.data?.map((p) => (
          <Card key={p.lineageId}>
            <Link to={paths.profile(p.id)} className="text-lg font-semibold text-brand underline">
              {p.name}
            </Link>
            <p className="mt-1 text-sm">
              Version {p.version} · {p.ruleCount} rules, {p.houseRuleCount} of them house rules
            </p>
            {p.notes && <p className="mt-1 text-sm text-ink-soft">{p.notes}</p>}
            {p.versions.length > 1 && (
              <p className="mt-2 text-sm">
                Older versions:{' '}
                {p.versions.slice(1).map((v, i) => (
                  <span key={v.id}>
                    {i > 0 && ', '}
                    <Link className="text-brand underline" to={paths.profile(v.id)}>
                      {v.version}
                    </Link>
                  </span>
                ))}
              </p>
            )}
          </Card>
        ))}
      </div>
    </>
  );
}
