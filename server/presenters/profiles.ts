// A stored limit profile row as the domain's LimitProfile, and as the API answers it.
import type { ProfileRow } from '../db/profiles.repository';
import type { EquipmentKind, LimitProfile, LimitRule } from '../../shared/domain/limits';

/** A stored row as the domain's LimitProfile (what evaluateReading and stepsForKind take). */
export function toLimitProfile(row: ProfileRow): LimitProfile {
  return {
    name: row.name,
    version: row.version,
    rules: JSON.parse(row.rulesJson) as LimitRule[],
    loopRequired: JSON.parse(row.loopRequiredJson) as EquipmentKind[],
    temperatureReferenceC: row.temperatureReferenceC,
  };
}

export function presentProfile(row: ProfileRow) {
  const p = toLimitProfile(row);
  return {
    id: row.id,
    lineageId: row.lineageId,
    name: row.name,
    version: row.version,
    rules: p.rules,
    loopRequired: p.loopRequired ?? [],
    temperatureReferenceC: row.temperatureReferenceC,
    notes: row.notes,
    createdAt: row.createdAt,
    createdBy: row.createdBy,
  };
}
