import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { TestKind } from '@shared/domain/limits';
import type { ReadingDto } from '@shared/schemas/readings';
import type { FaultKind, FaultStatus, RepairAction } from '@shared/schemas/faults';

export interface FaultEstimateDto {
  id: string;
  method: string;
  fromEnd: 'near' | 'far';
  distanceM: number;
  fromOtherEndM: number | null;
  uncertaintyM: number;
  distanceFromNearM: number | null;
  faultOhm: number | null;
  explanation: string;
  inputs: Record<string, number | string>;
  createdAt: string;
  createdByName: string | null;
}

export interface CombinedDto {
  distanceM: number;
  uncertaintyM: number;
  agree: boolean;
  disagreements: Array<[number, number]>;
  explanation: string;
  count: number;
}

export interface EquipmentDto {
  id: string;
  assetTag: string;
  kind: string;
  description: string;
  lengthM: number | null;
  velocityFactor: number | null;
  conductorMm2: number | null;
  status: string;
}

export interface FaultDetail {
  id: string;
  venueId: string;
  stripId: string;
  stripLabel: string;
  positionId: string;
  positionName: string;
  stepId: string | null;
  equipment: EquipmentDto | null;
  currentEquipment: EquipmentDto | null;
  kind: FaultKind;
  conductors: string;
  status: FaultStatus;
  notes: string | null;
  version: number;
  openedAt: string;
  openedByName: string | null;
  closedAt: string | null;
  /** Closed by the event's director as a typing mistake. */
  dismissal: { at: string; by: string | null; byName: string | null; reason: string } | null;
  /** The caller is the event's director and the fault can still be dismissed. */
  canDismiss: boolean;
  lengthM: number | null;
  estimates: FaultEstimateDto[];
  combined: CombinedDto | null;
  repairs: {
    id: string;
    action: RepairAction;
    lengthRemovedM: number | null;
    lengthBeforeM: number | null;
    replacementEquipmentId: string | null;
    notes: string | null;
    createdAt: string;
    createdByName: string | null;
  }[];
  steps: { id: string; testKind: TestKind; conductors: string; required: boolean; latest: ReadingDto | null; readings: ReadingDto[] }[];
  prefill: {
    lengthM: number | null;
    velocityFactor: number | null;
    soundConductor: string | null;
    conductorOhm: number | null;
    ohmPerMetre: number | null;
    ohmPerMetreSource: string | null;
  };
}

export const getFault = (faultId: string) => api.get<FaultDetail>(`/faults/${faultId}`);
export const faultQueryOptions = (faultId: string) => queryOptions({ queryKey: ['faults', faultId], queryFn: () => getFault(faultId) });
export const useFault = (faultId: string) => useQuery(faultQueryOptions(faultId));
