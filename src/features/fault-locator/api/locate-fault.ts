import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { FaultLocationAnswer } from '@shared/domain/fault-location';
import type { FaultLocationRequest } from '@shared/schemas/fault-location';

/** The server's answer for one set of readings: the authority the browser's estimate is checked against. */
export const locateFault = (request: FaultLocationRequest) =>
  api.post<FaultLocationAnswer>('/fault-location', request as unknown as Record<string, unknown>);

// A computation, not a change: nothing to invalidate.
export const useLocateFault = () => useMutation({ mutationFn: locateFault });
