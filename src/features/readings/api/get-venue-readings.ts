import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { TestKind } from '@shared/domain/limits';
import { readingsFilterQuery, type ReadingsFilter } from '@shared/schemas/readings-table';

export interface ReadingRow {
  id: string;
  stripId: string;
  stripLabel: string;
  stripSort: number;
  positionId: string;
  positionName: string;
  positionSort: number;
  assetTag: string | null;
  stepId: string;
  testKind: TestKind;
  conductors: string;
  stepSort: number;
  valueText: string;
  /** After the test-lead null was subtracted. */
  valueOhm: number | null;
  overRange: boolean;
  /** The test-lead null subtracted, its record and the meter it was measured with. */
  leadOffsetOhm: number | null;
  leadNullId: string | null;
  leadNullMeter: string | null;
  verdict: 'pass' | 'near-limit' | 'fail';
  limitOhm: number | null;
  limitKind: 'max' | 'min' | null;
  source: string;
  explanation: string;
  profileName: string | null;
  profileVersion: number;
  takenBy: string | null;
  takenByName: string | null;
  takenAt: string;
  /** When the server got it; later than takenAt for a reading typed offline. */
  receivedAt: string | null;
  supersedesId: string | null;
  supersededBy: string | null;
  superseded: boolean;
  correctionReason: string | null;
}

export const getVenueReadings = (venueId: string) => api.get<ReadingRow[]>(`/venues/${venueId}/readings`);
export const venueReadingsQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'readings'], queryFn: () => getVenueReadings(venueId) });
export const useVenueReadings = (venueId: string) => useQuery(venueReadingsQueryOptions(venueId));
/** The export of what the table shows: the same filters as query parameters. */
export const venueReadingsCsvUrl = (venueId: string, filter: ReadingsFilter = {}) => `/api/venues/${venueId}/readings.csv${readingsFilterQuery(filter)}`;
