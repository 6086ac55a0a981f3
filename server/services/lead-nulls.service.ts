// A technician's test-lead null: recorded on its own (who, when, value, which meter) before the
// readings that use it. Judged by the shared engine's rule (at most LEAD_NULL_MAX_OHM).
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { leadNullsRepository, type LeadNullRow } from '../db/lead-nulls.repository';
import { recordAudit } from '../db/audit.repository';
import { unprocessable } from '../lib/app-error';
import { nowIso } from '../lib/ids';
import { decideTakenAt } from '../../shared/domain/reading-time';
import { parseLeadNull } from '../../shared/domain/typed-reading';
import type { CreateLeadNullInput, LeadNullDto } from '../../shared/schemas/lead-nulls';

function present(row: LeadNullRow, takenByName: string | null): LeadNullDto {
  return {
    id: row.id,
    valueText: row.valueText,
    valueOhm: row.valueOhm,
    meter: row.meter,
    takenAt: row.takenAt,
    receivedAt: row.receivedAt,
    takenBy: row.takenBy,
    takenByName,
  };
}

export function leadNullsService(deps: AppDeps) {
  /**
   * Records a null. The same id again answers the stored one (`replayed`) when it is the same
   * person, value and meter (a tablet sending it again), and refuses it otherwise.
   */
  function create(user: AuthUser, sessionId: string | undefined, body: CreateLeadNullInput): { replayed: boolean; leadNull: LeadNullDto } {
    const meter = body.meter ? body.meter : null;
    return deps.db.transaction((tx) => {
      const repo = leadNullsRepository(tx);
      const existing = repo.findById(body.id);
      if (existing) {
        const same =
          existing.leadNull.takenBy === user.id && existing.leadNull.valueText === body.value && existing.leadNull.meter === meter;
        if (!same) {
          throw unprocessable(
            'idempotency-mismatch',
            'A test-lead null with this id was already recorded with different content. Make a new id for a new null.',
            {
              errors: [{ path: 'id', message: 'This id belongs to a different test-lead null' }],
            },
          );
        }
        return { replayed: true, leadNull: present(existing.leadNull, existing.takenByName) };
      }
      const parsed = parseLeadNull(body.value);
      if (!parsed.ok) throw unprocessable('bad-lead-null', parsed.message, { errors: [{ path: 'value', message: parsed.message }] });
      const receivedAt = nowIso();
      const time = decideTakenAt(body.takenAt, receivedAt);
      const row: LeadNullRow = {
        id: body.id,
        orgId: user.orgId,
        takenBy: user.id,
        sessionId: sessionId ?? null,
        valueText: body.value,
        valueOhm: parsed.valueOhm,
        meter,
        takenAt: time.takenAt,
        receivedAt,
      };
      repo.insert(row);
      recordAudit(tx, user, 'lead-null.recorded', 'lead-null', row.id, {
        value: body.value,
        valueOhm: parsed.valueOhm,
        meter,
        ...('refused' in time ? { tabletTakenAt: time.refused.claimed, tabletClock: time.refused.why } : {}),
      });
      return { replayed: false, leadNull: present(row, user.name) };
    });
  }

  return { create };
}
