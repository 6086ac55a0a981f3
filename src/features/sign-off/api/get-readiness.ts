import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { VenueReadiness, ReadinessIssue } from '@shared/domain/readiness';

export interface ReadinessDto extends Omit<VenueReadiness, 'issues'> {
  venue: { id: string; name: string; status: 'planning' | 'testing' | 'signed-off' };
  event: { id: string; name: string; startsOn: string; endsOn: string };
  canSignOff: boolean;
  signedOff: { signOffId: string; signedAt: string } | null;
  issues: (ReadinessIssue & { message: string })[];
}

export const getReadiness = (venueId: string) => api.get<ReadinessDto>(`/venues/${venueId}/readiness`);
export const readinessQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'readiness'], queryFn: () => getReadiness(venueId) });
export const useReadiness = (venueId: string) => useQuery(readinessQueryOptions(venueId));
