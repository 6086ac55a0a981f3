import { useState } from 'react';
import { Link, useParams } from 'react-router';
import type { ReadingsFilter } from '@shared/schemas/readings-table';
import { useMe } from '@/features/auth/api/get-me';
import { useVenueReadings, venueReadingsCsvUrl } from '@/features/readings/api/get-venue-readings';
import { useCorrectReading } from '@/features/readings/api/correct-reading';
import { ReadingsTable } from '@/features/readings/components/readings-table';
import { usePlan } from '@/features/plan/api/get-plan';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';

export default function VenueReadingsPage() {
  const { venueId = '' } = useParams();
  const me = useMe();
  const readings = useVenueReadings(venueId);
  const plan = usePlan(venueId);
  const correct = useCorrectReading(venueId);
  const [filter, setFilter] = useState<ReadingsFilter>({});
  // Directors and the venue's technicians may correct (the server checks the assignment).
  const canCorrect = me.data?.role === 'director' || me.data?.role === 'technician';
  return (
    <>
      <PageHeader
        title={`Readings${plan.data ? `: ${plan.data.venue.name}` : ''}`}
        subtitle={
          <>
            Every reading with its verdict, limit, source and profile version.{' '}
            <Link className="text-brand underline" to={paths.venue(venueId)}>
              Back to the venue
            </Link>
          </>
        }
        actions={
          <a
            className="inline-flex min-h-touch items-center rounded-lg bg-brand px-4 font-medium text-white"
            href={venueReadingsCsvUrl(venueId, filter)}
            download
          >
            {Object.values(filter).some(Boolean) ? 'Export CSV (filtered)' : 'Export CSV'}
          </a>
        }
      />
      <Card className="p-0!">
        {readings.isPending && <Loading />}
        {readings.isError && <Notice tone="error">{readings.error.message}</Notice>}
        {readings.data && (
          <ReadingsTable
            rows={readings.data}
            canCorrect={canCorrect}
            onCorrect={(v) => correct.mutateAsync(v)}
            filter={filter}
            onFilterChange={setFilter}
          />
        )}
      </Card>
    </>
  );
}
