// A stored reading as the API answers it (the reading write, the strip, the fault page).
import type { ReadingRow } from '../db/strips.repository';
import type { ReadingDto } from '../../shared/schemas/readings';

export function presentReading(r: ReadingRow, takenByName: string | null, faultId?: string | null): ReadingDto {
  const dto: ReadingDto = {
    id: r.id,
    stepId: r.stepId,
    equipmentId: r.equipmentId,
    valueText: r.valueText,
    valueOhm: r.valueOhm,
    overRange: r.overRange,
    leadOffsetOhm: r.leadOffsetOhm,
    leadNullId: r.leadNullId,
    temperatureC: r.temperatureC,
    verdict: r.verdict,
    limitOhm: r.limitOhm,
    limitKind: r.limitKind,
    source: r.source,
    ruleId: r.ruleId,
    profileId: r.profileId,
    profileVersion: r.profileVersion,
    explanation: r.explanation,
    supersedesId: r.supersedesId,
    correctionReason: r.correctionReason,
    takenAt: r.takenAt,
    receivedAt: r.receivedAt,
    takenBy: r.takenBy,
    takenByName,
  };
  if (faultId !== undefined) dto.faultId = faultId;
  return dto;
}
