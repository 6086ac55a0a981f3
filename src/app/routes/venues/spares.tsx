import { useMemo } from 'react';
import { Link, useParams } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { useSpares } from '@/features/incidents/api/get-spares';
import { useSetSpares } from '@/features/incidents/api/set-spares';
import { SparesEditor } from '@/features/incidents/components/spares-editor';
import { SparesTable, spareColumns } from '@/features/incidents/components/spares-table';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';

const linkClass = 'inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium hover:bg-paper';

/** The venue's spare pool: the director names the tags; everyone sees which spares are tested. */
export default function SparesPage() {
  const { venueId = '' } = useParams();
  const me = useMe();
  const pool = useSpares(venueId);
  const save = useSetSpares(venueId);
  const columns = useMemo(() => spareColumns({ item: paths.equipmentItem, strip: paths.stripTest }), []);
  if (pool.isPending) return <Loading />;
  if (pool.isError) return <Notice tone="error">{pool.error.message}</Notice>;
  const { spares, stripId } = pool.data;
  const isDirector = me.data?.role === 'director';
  const canTest = isDirector || me.data?.role === 'technician';
  const tested = spares.filter((s) => s.tested).length;
  return (
    <>
      <PageHeader
        title="Spares"
        subtitle={`${tested} of ${spares.length} spares tested at this venue · a tested spare needs only its connection checked once swapped in`}
        actions={
          <>
            {canTest && stripId && (
              <Link
                to={paths.stripTest(stripId)}
                className="inline-flex min-h-touch items-center rounded-lg bg-brand px-4 font-medium text-white"
              >
                Test the spares
              </Link>
            )}
            <Link to={paths.venueIncidents(venueId)} className={linkClass}>
              Incidents
            </Link>
            <Link to={paths.venue(venueId)} className={linkClass}>
              Venue
            </Link>
          </>
        }
      />
      <div className={`grid gap-6 ${isDirector ? 'lg:grid-cols-[2fr_1fr]' : ''}`}>
        <Card className="overflow-x-auto p-0!">
          <h2 className="border-b border-line px-5 py-3 text-lg font-semibold">The pool</h2>
          <SparesTable spares={spares} columns={columns} />
        </Card>
        {isDirector && (
          <Card className="self-start">
            <h2 className="mb-3 text-lg font-semibold">Set the pool</h2>
            <SparesEditor
              key={spares.map((s) => s.equipment.assetTag).join(',')}
              current={spares.map((s) => s.equipment.assetTag)}
              onSave={(body) => save.mutateAsync(body)}
            />
          </Card>
        )}
      </div>
    </>
  );
}
