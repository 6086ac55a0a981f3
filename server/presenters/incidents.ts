// Incident rows → answers: the incident, its swaps, minutes out of service.
import type { Db, Tx } from '../db/client';
import { incidentsRepository, type IncidentListRow } from '../db/incidents.repository';
import { certificatesRepository } from '../db/certificates.repository';
import { minutesOutOfService } from '../../shared/domain/out-of-service';

type Item = {
  id: string;
  assetTag: string;
  kind: 'floor-cable' | 'reel' | 'piste' | 'body-wire' | 'apparatus' | 'other';
  description: string;
};
const itemRef = (e: Item | null) => (e ? { id: e.id, assetTag: e.assetTag, kind: e.kind, description: e.description } : null);

export function presentIncidents(db: Db | Tx, rows: IncidentListRow[], now = new Date().toISOString()) {
  const repo = incidentsRepository(db);
  const swaps = repo.swapsOf(rows.map((r) => r.incident.id));
  const amendedNumbers = new Map<string, string>();
  for (const r of rows) {
    const id = r.incident.amendmentId;
    if (id && !amendedNumbers.has(`${id}:${r.incident.stripId}`)) {
      const cert = certificatesRepository(db)
        .ofAmendment(id)
        .find((c) => c.stripId === r.incident.stripId);
      if (cert) amendedNumbers.set(`${id}:${r.incident.stripId}`, cert.number);
    }
  }
  return rows.map(({ incident: i, stripLabel, positionName, equipment, openedByName, amendedAt }) => ({
    id: i.id,
    venueId: i.venueId,
    stripId: i.stripId,
    stripLabel,
    positionId: i.positionId,
    positionName,
    equipment: itemRef(equipment),
    symptom: i.symptom,
    status: i.status,
    clientId: i.clientId,
    openedAt: i.openedAt,
    openedBy: i.openedBy,
    openedByName,
    resolvedAt: i.resolvedAt,
    resolvedBy: i.resolvedBy,
    minutesOutOfService: minutesOutOfService(i.openedAt, i.resolvedAt ?? now),
    swaps: swaps
      .filter((s) => s.swap.incidentId === i.id)
      .map((s) => ({
        id: s.swap.id,
        positionId: s.swap.positionId,
        positionName: s.positionName,
        removed: itemRef(s.removed),
        replacement: itemRef(s.replacement)!,
        spareTested: s.swap.spareTested,
        at: s.swap.createdAt,
        by: s.swap.createdBy,
        byName: s.byName,
      })),
    amendment:
      i.amendmentId && amendedAt
        ? { id: i.amendmentId, number: amendedNumbers.get(`${i.amendmentId}:${i.stripId}`) ?? '', at: amendedAt }
        : null,
  }));
}
export type PresentedIncident = ReturnType<typeof presentIncidents>[number];
