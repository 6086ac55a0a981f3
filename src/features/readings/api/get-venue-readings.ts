import { queryOptions, useQuery } from '@tanstack/react-query';
import { call, urlOf } from '@/lib/api-client';
import { readingsTableContracts, type ReadingRow } from '@shared/contracts/readings-table';

export type { ReadingRow };

export const getVenueReadings = (venueId: string) => call(readingsTableContracts.list, { params: { id: venueId } });
export const venueReadingsQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'readings'], queryFn: () => getVenueReadings(venueId) });
export const useVenueReadings = (venueId: string) => useQuery(venueReadingsQueryOptions(venueId));
export const venueReadingsCsvUrl = (venueId: string) => urlOf(readingsTableContracts.csv, { id: venueId });
