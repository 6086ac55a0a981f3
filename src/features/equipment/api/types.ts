import type { EquipmentKind } from '@shared/domain/limits';
import type { EquipmentStatus } from '@shared/schemas/equipment';

export interface EquipmentItem {
  id: string;
  assetTag: string;
  kind: EquipmentKind;
  description: string;
  lengthM: number | null;
  conductorMm2: number | null;
  awg: number | null;
  cableType: string | null;
  velocityFactor: number | null;
  status: EquipmentStatus;
  notes: string | null;
  version: number;
  createdAt: string;
}

export interface EquipmentDetail {
  item: EquipmentItem;
  originalLengthM: number | null;
  lengthRemovedM: number;
  readings: {
    id: string;
    valueText: string;
    verdict: 'pass' | 'near-limit' | 'fail';
    limitOhm: number | null;
    testKind: string;
    conductors: string;
    positionName: string;
    stripLabel: string;
    venueId: string;
    venueName: string;
    eventName: string;
    takenAt: string;
    takenByName: string | null;
    supersedesId: string | null;
  }[];
  faults: { id: string; kind: string; conductors: string; status: string; openedAt: string; stripLabel: string; positionName: string; venueName: string; eventName: string }[];
  repairs: {
    id: string;
    action: 'cut-out' | 'connector-remade' | 'swapped' | 'retired';
    role: 'repaired' | 'replacement';
    lengthRemovedM: number | null;
    lengthBeforeM: number | null;
    lengthAfterM: number | null;
    notes: string | null;
    byName: string | null;
    createdAt: string;
  }[];
  placements: { id: string; assignedAt: string; removedAt: string | null; positionName: string; stripLabel: string; venueId: string; venueName: string; eventName: string }[];
  calibrations: { id: string; velocityFactor: number; lengthM: number; roundTripNs: number; byName: string | null; createdAt: string }[];
}
