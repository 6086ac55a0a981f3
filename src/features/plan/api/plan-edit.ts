import { useMutation, useQueryClient } from '@tanstack/react-query';
import { planQueryOptions } from './get-plan';
import type { VenuePlan } from './types';

/**
 * Shared by every plan edit endpoint: the call sends If-Match with the version the editor shows;
 * the answer is the new plan, which replaces the cached one. A 412 leaves the cache alone so the
 * person sees what they typed and can reload the plan on purpose.
 */
export function usePlanEdit<V>(venueId: string, call: (vars: V & { version: number }) => Promise<VenuePlan>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: call,
    onSuccess: (plan) => {
      qc.setQueryData(planQueryOptions(venueId).queryKey, plan);
      // Others (venue page, board, strips) read the same venue.
      qc.invalidateQueries({ queryKey: ['venues'], predicate: (q) => q.queryKey[2] !== 'plan' });
    },
  });
}

export const ifMatch = (version: number) => ({ 'If-Match': `"${version}"` });
