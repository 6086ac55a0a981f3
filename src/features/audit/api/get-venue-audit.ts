import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface AuditEntry {
  id: number;
  at: string;
  action: string;
  entityType: string;
  entityId: string;
  actorId: string | null;
  actorName: string | null;
  detail: Record<string, unknown>;
}

export const getVenueAudit = (venueId: string) => api.get<AuditEntry[]>(`/venues/${venueId}/audit`);
export const venueAuditQueryOptions = (venueId: string) => queryOptions({ queryKey: ['venues', venueId, 'audit'], queryFn: () => getVenueAudit(venueId) });
export const useVenueAudit = (venueId: string) => useQuery(venueAuditQueryOptions(venueId));
