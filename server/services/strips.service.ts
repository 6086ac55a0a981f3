// One strip as the testing screen needs it: positions, items, ordered active steps with their
// latest reading, the limit profile the browser judges with, and the faults not yet closed.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { stripsRepository, latestByStep } from '../db/strips.repository';
import { faultsRepository } from '../db/faults.repository';
import { accessService } from './access.service';
import { venuesService } from './venues.service';
import { presentReading } from '../presenters/readings';
import { limitProfileById } from './profiles.service';
import { presentEquipment, presentFaultList } from '../presenters/faults';
import { notFound } from '../lib/app-error';
import { stepCounts, stepProgressOf, stripFlags, stripStatus } from '../../shared/domain/progress';
import { stepInstruction } from '../../shared/domain/checklist';

export function stripsService(deps: AppDeps) {
  const access = accessService(deps.db);
  const repo = stripsRepository(deps.db);

  function get(user: AuthUser, id: string) {
    const found = repo.findStrip(id);
    if (!found || found.event.orgId !== user.orgId) throw notFound('That strip');
    access.requireVenue(user, found.venue.id, 'read');
    const { strip, venue } = found;

    const positionRows = repo.positionsWithEquipment(strip.id);
    const steps = repo.activeStepsOf(positionRows.map((p) => p.position.id));
    const latest = latestByStep(repo.readingsOfSteps(steps.map((s) => s.id)));
    const faultsRepo = faultsRepository(deps.db);
    // A repaired fault carries the time of its repair: readings taken since then are its retest.
    const openFaults = presentFaultList(deps.db, faultsRepo.unclosedOfStrip(strip.id)).map((f) => ({
      ...f,
      repairedAt: f.status === 'repaired' ? (faultsRepo.latestRepairOf(f.id)?.createdAt ?? null) : null,
    }));
    const profile = limitProfileById(deps.db, venue.profileId);

    const positions = positionRows.map(({ position, equipment }) => ({
      id: position.id,
      name: position.name,
      equipmentKind: position.equipmentKind,
      equipment: presentEquipment(equipment),
      steps: steps
        .filter((s) => s.positionId === position.id)
        .map((s) => {
          const l = latest.get(s.id);
          return {
            id: s.id,
            testKind: s.testKind,
            conductors: s.conductors,
            required: s.required,
            instruction: stepInstruction(s.testKind, s.conductors),
            latest: l ? presentReading(l.reading, l.takenByName) : null,
          };
        }),
    }));
    const allSteps = stepProgressOf(positions);
    const counts = stepCounts(allSteps);

    const venueProgress = venuesService(deps).stripProgress(venue.id);
    const order = repo.stripIdsOfVenue(venue.id);
    const at = order.findIndex((s) => s.id === strip.id);

    return {
      id: strip.id,
      label: strip.label,
      status: stripStatus({ ...stripFlags(strip), steps: allSteps, openFaults: openFaults.length }),
      zone: strip.zone,
      conductivePiste: strip.conductivePiste,
      sparePool: strip.sparePool,
      withdrawnReason: strip.withdrawnReason,
      venueId: venue.id,
      venueName: venue.name,
      venueStatus: venue.status,
      profile: profile
        ? {
            id: venue.profileId,
            name: profile.name,
            version: profile.version,
            rules: profile.rules,
            loopRequired: profile.loopRequired ?? [],
            temperatureReferenceC: profile.temperatureReferenceC ?? null,
          }
        : null,
      counts,
      venueProgress: {
        stepsDone: venueProgress.reduce((n, p) => n + p.counts.done, 0),
        stepsTotal: venueProgress.reduce((n, p) => n + p.counts.total, 0),
        stripsClear: venueProgress.filter((p) => p.status === 'clear').length,
        stripCount: venueProgress.length,
      },
      previousStripId: at > 0 ? order[at - 1]!.id : null,
      nextStripId: at >= 0 && at < order.length - 1 ? order[at + 1]!.id : null,
      positions,
      openFaults,
    };
  }

  return { get };
}
