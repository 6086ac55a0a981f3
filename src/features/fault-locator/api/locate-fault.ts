import { useMutation } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { faultLocationContracts } from '@shared/contracts/fault-location';
import type { LengthSystem } from '@shared/domain/units';
import type { FaultLocationRequest } from '@shared/schemas/fault-location';

export interface LocateFaultInput {
  request: FaultLocationRequest;
  /**
   * The units the server words its explanation in (the user's preference, which the page shows).
   * Not sent: kept with the answer so that one worded in the other system is known to be stale.
   */
  unitSystem: LengthSystem;
}

/** The server's answer for one set of readings: the authority the browser's estimate is checked against. */
export const locateFault = (request: FaultLocationRequest) => call(faultLocationContracts.locate, { body: request });

// A computation, not a change: nothing to invalidate.
export const useLocateFault = () => useMutation({ mutationFn: ({ request }: LocateFaultInput) => locateFault(request) });
