import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { incidentsContracts, type SparePool } from '@shared/contracts/incidents';

export type { SparePool };
export type Spare = SparePool['spares'][number];

export const getSpares = (venueId: string) => call(incidentsContracts.spares, { params: { id: venueId } });
export const sparesQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'spares'], queryFn: () => getSpares(venueId) });
export const useSpares = (venueId: string, opts: { enabled?: boolean } = {}) =>
  useQuery({ ...sparesQueryOptions(venueId), enabled: opts.enabled ?? true });
