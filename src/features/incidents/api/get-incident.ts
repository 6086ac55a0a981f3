import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { incidentsContracts, type IncidentDetail } from '@shared/contracts/incidents';

export type { IncidentDetail };
export type RetestStep = IncidentDetail['retest']['steps'][number];

export const getIncident = (incidentId: string) => call(incidentsContracts.get, { params: { id: incidentId } });
export const incidentQueryOptions = (incidentId: string) =>
  queryOptions({ queryKey: ['incidents', incidentId], queryFn: () => getIncident(incidentId) });
/** Polled while open: a retest typed on another tablet ticks its step off here too. */
export const useIncident = (incidentId: string | null) =>
  useQuery({
    ...incidentQueryOptions(incidentId ?? ''),
    enabled: !!incidentId,
    refetchInterval: (q) => (q.state.data?.incident.status === 'open' ? 5_000 : false),
  });
