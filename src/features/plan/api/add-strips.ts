import { api } from '@/lib/api-client';
import type { BulkStripsInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';
import type { VenuePlan } from './types';

export const addStrips = (venueId: string, { version, ...body }: BulkStripsInput & { version: number }) =>
  api.post<VenuePlan>(`/venues/${venueId}/strips/bulk`, body as Record<string, unknown>, ifMatch(version));
export const useAddStrips = (venueId: string) => usePlanEdit<BulkStripsInput>(venueId, (v) => addStrips(venueId, v));
