import type { EquipmentKind, LimitRule } from '@shared/domain/limits';

export interface ProfileSummary {
  id: string;
  lineageId: string;
  name: string;
  version: number;
  rules: LimitRule[];
  loopRequired: EquipmentKind[];
  /** Copper readings are corrected to this °C (a house rule); null: judged as measured. */
  temperatureReferenceC: number | null;
  notes: string | null;
  createdAt: string;
  ruleCount: number;
  houseRuleCount: number;
  versions: { id: string; version: number; createdAt: string }[];
}
export interface ProfileDetail extends Omit<ProfileSummary, 'ruleCount' | 'houseRuleCount' | 'versions'> {
  latestVersion: number;
  latestId: string;
  versions: { id: string; version: number; createdAt: string; byName: string | null; notes: string | null }[];
  usedBy: { venueId: string; venueName: string; eventName: string; profileId: string; version: number }[];
}
