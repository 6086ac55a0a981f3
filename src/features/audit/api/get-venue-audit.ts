import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { auditContracts, type AuditEntry } from '@shared/contracts/audit';

export type { AuditEntry };

export const getVenueAudit = (venueId: string) => call(auditContracts.ofVenue, { params: { id: venueId } });
export const venueAuditQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'audit'], queryFn: () => getVenueAudit(venueId) });
export const useVenueAudit = (venueId: string) => useQuery(venueAuditQueryOptions(venueId));
