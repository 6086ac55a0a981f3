// An item's incidents across events, and whether the register flags it for inspection: after
// repeated incidents (REPEATED_INCIDENTS, common practice) or while it waits to be looked at after
// being taken out of a strip.
import type { Db } from '../db/client';
import type { EquipmentRow } from '../db/equipment.repository';
import { incidentsRepository, itemIncidentsRepository } from '../db/incidents.repository';
import { minutesOutOfService } from '../../shared/domain/out-of-service';
import { REPEATED_INCIDENTS } from '../../shared/schemas/incidents';

type Role = 'in-position' | 'removed' | 'installed';

export function incidentHistory(db: Db, item: EquipmentRow, mayShow: (venueId: string) => boolean) {
  const swaps = itemIncidentsRepository(db).swapsTouching(item.id);
  const roles = new Map<string, Role>();
  for (const s of swaps) roles.set(s.incidentId, s.removedEquipmentId === item.id ? 'removed' : 'installed');
  const own = incidentsRepository(db).ofEquipment([item.id]);
  const viaSwap = incidentsRepository(db).ofIds([...roles.keys()].filter((id) => !own.some((r) => r.incident.id === id)));
  const rows = [...own, ...viaSwap]
    .filter((r) => mayShow(r.incident.venueId))
    .sort((a, b) => b.incident.openedAt.localeCompare(a.incident.openedAt));
  const names = new Map(
    itemIncidentsRepository(db)
      .venueNames([...new Set(rows.map((r) => r.incident.venueId))])
      .map((v) => [v.id, v]),
  );
  const now = new Date().toISOString();
  const incidents = rows.map(({ incident: i, stripLabel, positionName }) => ({
    id: i.id,
    stripLabel,
    venueId: i.venueId,
    venueName: names.get(i.venueId)?.name ?? '',
    eventName: names.get(i.venueId)?.eventName ?? '',
    stripId: i.stripId,
    positionName,
    symptom: i.symptom,
    status: i.status,
    openedAt: i.openedAt,
    resolvedAt: i.resolvedAt,
    minutesOutOfService: minutesOutOfService(i.openedAt, i.resolvedAt ?? now),
    role: roles.get(i.id) ?? ('in-position' as const),
  }));
  // Counted on the item's own trouble: the incidents it was in or taken out for, not those it was put in to mend.
  const count = incidents.filter((i) => i.role !== 'installed').length;
  const repeated = count >= REPEATED_INCIDENTS;
  const toInspect = item.toInspectIncidentId !== null;
  const reason = repeated
    ? `${count} incidents across events: inspect it before it goes on a strip again.`
    : toInspect
      ? 'Taken out of a strip during an incident: inspect it before it goes on a strip again.'
      : null;
  return {
    incidents,
    inspection: { flagged: repeated || toInspect, repeatedIncidents: repeated, toInspect, incidentCount: count, reason },
  };
}
