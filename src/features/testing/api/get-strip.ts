import { useEffect } from 'react';
import { queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { EquipmentKind, LimitRule, TestKind } from '@shared/domain/limits';
import type { StripStatus } from '@shared/domain/progress';
import type { ReadingDto } from '@shared/schemas/readings';
import type { FaultKind, FaultStatus } from '@shared/schemas/faults';

export interface StripStep {
  id: string;
  testKind: TestKind;
  conductors: string;
  required: boolean;
  instruction: string;
  latest: ReadingDto | null;
}

export interface StripPosition {
  id: string;
  name: string;
  equipmentKind: EquipmentKind;
  equipment: { id: string; assetTag: string; kind: EquipmentKind; lengthM: number | null; velocityFactor: number | null; conductorMm2: number | null; status: string } | null;
  steps: StripStep[];
}

export interface StripFault {
  id: string;
  positionId: string;
  positionName: string;
  stepId: string | null;
  kind: FaultKind;
  conductors: string;
  status: FaultStatus;
  equipment: { assetTag: string } | null;
  /** When it was repaired (a repaired fault only): readings since then are its retest. */
  repairedAt: string | null;
}

export interface StripDetail {
  id: string;
  label: string;
  status: StripStatus;
  zone: string | null;
  conductivePiste: boolean;
  withdrawnReason: string | null;
  venueId: string;
  venueName: string;
  venueStatus: string;
  profile: { id: string; name: string; version: number; rules: LimitRule[]; loopRequired: EquipmentKind[]; temperatureReferenceC: number | null } | null;
  counts: { total: number; done: number; passed: number; nearLimit: number; failed: number };
  venueProgress: { stepsDone: number; stepsTotal: number; stripsClear: number; stripCount: number };
  previousStripId: string | null;
  nextStripId: string | null;
  positions: StripPosition[];
  openFaults: StripFault[];
}

export const getStrip = (stripId: string) => api.get<StripDetail>(`/strips/${stripId}`);
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
