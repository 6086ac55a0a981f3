import { queryOptions, useQuery } from '@tanstack/react-query';
import { call, urlOf } from '@/lib/api-client';
import { readingsTableContracts, type ReadingRow } from '@shared/contracts/readings-table';
import type { ReadingsFilter } from '@shared/schemas/readings-table';

export type { ReadingRow };

export const getVenueReadings = (venueId: string) => call(readingsTableContracts.list, { params: { id: venueId } });
export const venueReadingsQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'readings'], queryFn: () => getVenueReadings(venueId) });
export const useVenueReadings = (venueId: string) => useQuery(venueReadingsQueryOptions(venueId));
/** The export of what the table shows: the same filters as query parameters, in a stable order. */
export const venueReadingsCsvUrl = (venueId: string, f: ReadingsFilter = {}) =>
  urlOf(
    readingsTableContracts.csv,
    { id: venueId },
    { verdict: f.verdict, strip: f.strip, who: f.who, test: f.test, from: f.from, to: f.to },
  );
