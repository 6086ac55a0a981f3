// The status board: every strip of a venue at a glance, counts, progress and the open faults.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { accessService } from './access.service';
import { venuesService } from './venues.service';
import { presentFaultList } from '../presenters/faults';
import { faultsRepository } from '../db/faults.repository';
import type { StripStatus } from '../../shared/domain/progress';
import { incidentsRepository } from '../db/incidents.repository';
import { minutesOutOfService } from '../../shared/domain/out-of-service';

type Progress = ReturnType<ReturnType<typeof venuesService>['stripProgress']>;

/** Out-of-service strips first, longest out first; each with its open incidents and the minutes since the earliest. */
function withIncidents(deps: AppDeps, venueId: string, progress: Progress) {
  const open = incidentsRepository(deps.db)
    .ofVenue(venueId)
    .filter((r) => r.incident.status === 'open');
  const now = new Date().toISOString();
  const rows = progress.map((p) => {
    const mine = open
      .filter((r) => r.incident.stripId === p.strip.id)
      .map((r) => r.incident.openedAt)
      .sort();
    const since = p.strip.outOfServiceSince;
    const from = mine[0] ?? since;
    return {
      p,
      outOfServiceSince: since,
      minutesSinceIncident: since && from ? minutesOutOfService(from, now) : null,
      openIncidents: mine.length,
    };
  });
  const out = rows.filter((r) => r.outOfServiceSince).sort((a, b) => (b.minutesSinceIncident ?? 0) - (a.minutesSinceIncident ?? 0));
  return [...out, ...rows.filter((r) => !r.outOfServiceSince)];
}

export function boardService(deps: AppDeps) {
  const access = accessService(deps.db);
  const venues = venuesService(deps);

  return {
    board(user: AuthUser, venueId: string) {
      const { venue, event } = access.requireVenue(user, venueId, 'read');
      const progress = venues.stripProgress(venueId);
      const byStatus: Record<StripStatus, number> = {
        'not-started': 0,
        'in-progress': 0,
        clear: 0,
        'fault-open': 0,
        withdrawn: 0,
        'out-of-service': 0,
      };
      let stepsDone = 0;
      let stepsTotal = 0;
      for (const p of progress) {
        byStatus[p.status] += 1;
        stepsDone += p.counts.done;
        stepsTotal += p.counts.total;
      }
      const openFaults = presentFaultList(deps.db, faultsRepository(deps.db).ofVenue(venueId)).filter((f) => f.status !== 'closed');
      return {
        venue: { id: venue.id, name: venue.name, status: venue.status, eventId: event.id, eventName: event.name },
        counts: byStatus,
        progress: { stepsDone, stepsTotal, percent: stepsTotal === 0 ? 0 : Math.round((stepsDone / stepsTotal) * 100) },
        strips: withIncidents(deps, venueId, progress).map(({ p, outOfServiceSince, minutesSinceIncident, openIncidents }) => ({
          id: p.strip.id,
          label: p.strip.label,
          zone: p.strip.zone,
          sortOrder: p.strip.sortOrder,
          status: p.status,
          withdrawnReason: p.strip.withdrawnReason,
          openFaults: p.openFaults,
          ...p.counts,
          outOfServiceSince,
          minutesSinceIncident,
          openIncidents,
        })),
        openFaults,
        generatedAt: new Date().toISOString(),
      };
    },
  };
}
