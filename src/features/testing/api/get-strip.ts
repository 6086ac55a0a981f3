import { useEffect } from 'react';
import { queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { stripsContracts, type StripDetail } from '@shared/contracts/strips';

export type { StripDetail };
export type StripPosition = StripDetail['positions'][number];
export type StripStep = StripPosition['steps'][number];
export type StripFault = StripDetail['openFaults'][number];

export const getStrip = (stripId: string) => call(stripsContracts.get, { params: { id: stripId } });
export const stripQueryOptions = (stripId: string) => queryOptions({ queryKey: ['strips', stripId], queryFn: () => getStrip(stripId) });
export const useStrip = (stripId: string) => useQuery(stripQueryOptions(stripId));

/**
 * Loads every strip of a venue into the cache (and so onto the tablet's disk) while the network is
 * there, so walking to a strip not opened yet still works when the hall's Wi-Fi drops.
 */
export function usePrefetchStrips(stripIds: string[], enabled: boolean) {
  const qc = useQueryClient();
  const key = stripIds.join(',');
  useEffect(() => {
    if (!enabled || !key || !navigator.onLine) return;
    // Not cancelled when the page is left: the technician usually opens a strip at once, and the
    // rest of the venue should still reach the tablet.
    void (async () => {
      const ids = key.split(',');
      // A few at a time: the hall's network is weak enough already.
      for (let i = 0; i < ids.length; i += 4) {
        await Promise.all(ids.slice(i, i + 4).map((id) => qc.prefetchQuery({ ...stripQueryOptions(id), staleTime: 60_000 })));
      }
    })();
  }, [qc, key, enabled]);
}
