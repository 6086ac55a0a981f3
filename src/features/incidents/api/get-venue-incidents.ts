import { queryOptions, useQuery } from '@tanstack/react-query';
import { call, urlOf } from '@/lib/api-client';
import { incidentsContracts, type Incident, type VenueIncidents } from '@shared/contracts/incidents';

export type { Incident, VenueIncidents };

export const INCIDENTS_REFRESH_MS = 10_000;

export const getVenueIncidents = (venueId: string) => call(incidentsContracts.ofVenue, { params: { id: venueId } });
export const venueIncidentsQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'incidents'], queryFn: () => getVenueIncidents(venueId) });
/** Polled like the board: an incident opened on another tablet shows up without a reload. */
export const useVenueIncidents = (venueId: string, opts: { enabled?: boolean } = {}) =>
  useQuery({ ...venueIncidentsQueryOptions(venueId), enabled: opts.enabled ?? true, refetchInterval: INCIDENTS_REFRESH_MS });

/** A plain link: the browser downloads the report with the session cookie. */
export const incidentReportUrl = (venueId: string) => urlOf(incidentsContracts.reportPdf, { id: venueId });
