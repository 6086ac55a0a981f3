// The incident report of a venue: each incident with its swap, the retest readings and the minutes
// out of service, and totals per strip and per item kind. A few pages at most, so it is drawn on
// the request's thread (the certificates' annexes, hundreds of pages, go to worker threads).
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { accessService } from './access.service';
import { incidentsRepository } from '../db/incidents.repository';
import { signOffRepository } from '../db/sign-off.repository';
import { presentIncidents, type PresentedIncident } from '../presenters/incidents';
import { withSpareReadings } from './spare-readings';
import { renderIncidentReport, type ReportIncident } from '../pdf/incident-report-pdf';
import { EQUIPMENT_KIND_LABELS } from '../../shared/schemas/equipment';
import { TEST_KIND_LABELS } from '../../shared/domain/checklist';

type StepRow = ReturnType<ReturnType<typeof signOffRepository>['stepsWithLatestReading']>[number];

function retestReadings(i: PresentedIncident, rows: StepRow[]): string {
  const until = i.resolvedAt ?? '9999';
  return rows
    .filter((r) => r.stripId === i.stripId && r.reading && r.reading.takenAt >= i.openedAt && r.reading.takenAt <= until)
    .map((r) => `${r.positionName} ${TEST_KIND_LABELS[r.testKind]} ${r.conductors}: ${r.reading!.valueText} (${r.reading!.verdict})`)
    .join('; ');
}

function totals<K extends string>(list: PresentedIncident[], keyOf: (i: PresentedIncident) => K) {
  const out = new Map<K, { label: K; incidents: number; minutes: number }>();
  for (const i of list) {
    const k = keyOf(i);
    const t = out.get(k) ?? { label: k, incidents: 0, minutes: 0 };
    t.incidents += 1;
    t.minutes += i.minutesOutOfService;
    out.set(k, t);
  }
  return [...out.values()];
}

/** The item an incident concerns: the one swapped out, else the one in its position when opened. */
const itemOf = (i: PresentedIncident) => i.swaps[0]?.removed ?? i.equipment;

export async function incidentReport(deps: AppDeps, user: AuthUser, venueId: string) {
  const { venue, event } = accessService(deps.db).requireVenue(user, venueId, 'read');
  const list = presentIncidents(deps.db, incidentsRepository(deps.db).ofVenue(venueId)).reverse();
  const rows = withSpareReadings(deps.db, signOffRepository(deps.db).stepsWithLatestReading(venueId));
  const incidents: ReportIncident[] = list.map((i) => {
    const item = itemOf(i);
    return {
      strip: i.stripLabel,
      item: item ? `${item.assetTag} (${i.positionName ?? EQUIPMENT_KIND_LABELS[item.kind]})` : (i.positionName ?? 'whole strip'),
      kind: item ? EQUIPMENT_KIND_LABELS[item.kind] : 'Not named',
      symptom: i.symptom,
      swap:
        i.swaps
          .map((s) => `${s.removed?.assetTag ?? 'empty'} → ${s.replacement.assetTag}${s.spareTested ? ' (tested spare)' : ''}`)
          .join('; ') || 'none',
      readings: retestReadings(i, rows) || 'none since the incident opened',
      openedAt: i.openedAt,
      resolvedAt: i.resolvedAt,
      minutes: i.minutesOutOfService,
    };
  });
  const org = signOffRepository(deps.db).organisation(event.orgId)!;
  const pdf = await renderIncidentReport({
    event: event.name,
    venue: venue.name,
    organisation: org.name,
    generatedAt: new Date().toISOString(),
    timeZone: venue.timeZone,
    incidents,
    perStrip: totals(list, (i) => i.stripLabel),
    perKind: totals(list, (i) => {
      const item = itemOf(i);
      return item ? EQUIPMENT_KIND_LABELS[item.kind] : 'Not named';
    }),
  });
  return { venueName: venue.name, pdf, count: list.length };
}
