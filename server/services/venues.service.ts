import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { venuesRepository } from '../db/venues.repository';
import { accessService } from './access.service';
import { stepCounts, stripFlags, stripStatus, type StepProgress, type StripStatus } from '../../shared/domain/progress';

export function venuesService(deps: AppDeps) {
  const repo = venuesRepository(deps.db);
  const access = accessService(deps.db);

  /** Status and counts of every strip of a venue, from the latest readings and open faults. */
  function stripProgress(venueId: string) {
    const stripRows = repo.stripsOf(venueId);
    const stepRows = repo.stepsWithLatest(venueId);
    const faultRows = repo.openFaultsOf(venueId);
    const byStrip = new Map<string, StepProgress[]>();
    for (const s of stepRows) {
      const list = byStrip.get(s.stripId) ?? [];
      list.push({ required: s.required, latestVerdict: s.verdict });
      byStrip.set(s.stripId, list);
    }
    const faultsByStrip = new Map<string, number>();
    for (const f of faultRows) faultsByStrip.set(f.stripId, (faultsByStrip.get(f.stripId) ?? 0) + 1);
    return stripRows.map((strip) => {
      const stepsOfStrip = byStrip.get(strip.id) ?? [];
      const openFaults = faultsByStrip.get(strip.id) ?? 0;
      return {
        strip,
        status: stripStatus({ ...stripFlags(strip), steps: stepsOfStrip, openFaults }),
        counts: stepCounts(stepsOfStrip),
        openFaults,
      };
    });
  }

  function summarise(progress: ReturnType<typeof stripProgress>) {
    const byStatus: Record<StripStatus, number> = {
      'not-started': 0,
      'in-progress': 0,
      clear: 0,
      'fault-open': 0,
      withdrawn: 0,
      'out-of-service': 0,
    };
    let total = 0;
    let done = 0;
    for (const p of progress) {
      byStatus[p.status] += 1;
      total += p.counts.total;
      done += p.counts.done;
    }
    return { byStatus, stepsTotal: total, stepsDone: done };
  }

  return {
    stripProgress,
    list(user: AuthUser) {
      return access.visibleVenues(user).map(({ venue, event }) => {
        const progress = stripProgress(venue.id);
        return {
          id: venue.id,
          name: venue.name,
          timeZone: venue.timeZone,
          eventId: event.id,
          eventName: event.name,
          startsOn: event.startsOn,
          endsOn: event.endsOn,
          status: venue.status,
          stripCount: progress.length,
          ...summarise(progress),
        };
      });
    },
    strips(user: AuthUser, venueId: string) {
      access.requireVenue(user, venueId, 'read');
      return stripProgress(venueId).map((p) => ({
        id: p.strip.id,
        label: p.strip.label,
        zone: p.strip.zone,
        sortOrder: p.strip.sortOrder,
        conductivePiste: p.strip.conductivePiste,
        status: p.status,
        withdrawnReason: p.strip.withdrawnReason,
        openFaults: p.openFaults,
        ...p.counts,
      }));
    },
  };
}
