import type { EquipmentKind, TestKind } from '@shared/domain/limits';

export interface PlanStep {
  id: string;
  testKind: TestKind;
  conductors: string;
  sortOrder: number;
  required: boolean;
  addedByDirector: boolean;
  removedAt: string | null;
}
export interface PlanPosition {
  id: string;
  name: string;
  equipmentKind: EquipmentKind;
  sortOrder: number;
  /** A reading or a fault was recorded against it: it stays in the plan (its steps can be dropped). */
  tested: boolean;
  equipment: { id: string; assetTag: string; kind: EquipmentKind; lengthM: number | null; status: string; description: string } | null;
  steps: PlanStep[];
}
export interface PlanStrip {
  id: string;
  label: string;
  zone: string | null;
  sortOrder: number;
  conductivePiste: boolean;
  withdrawnReason: string | null;
  withdrawnAt: string | null;
  positions: PlanPosition[];
}
export interface VenuePlan {
  venue: { id: string; name: string; status: 'planning' | 'testing' | 'signed-off'; version: number; profileId: string; clonedFromId: string | null; eventId: string };
  event: { id: string; name: string; startsOn: string; endsOn: string; directorId: string | null };
  profile: { id: string; lineageId: string; name: string; version: number; latestId: string; latestVersion: number; loopRequired: EquipmentKind[] };
  technicians: { id: string; name: string; email: string }[];
  strips: PlanStrip[];
}

export interface EventSummary {
  id: string;
  name: string;
  startsOn: string;
  endsOn: string;
  directorId: string | null;
  organiserId: string | null;
  venues: { id: string; name: string; status: string }[];
}
export interface EventDetail extends Omit<EventSummary, 'venues'> {
  directorName: string | null;
  organiserName: string | null;
  venues: { id: string; name: string; status: string; profileId: string; clonedFromId: string | null; stripCount: number }[];
}
export interface PlanningPeople {
  technicians: { id: string; name: string; email: string }[];
  organisers: { id: string; name: string; email: string }[];
}
