// Sign-off, step one: whether the venue is ready, from what the database says now. The same
// snapshot is taken again inside the sign-off's transaction, so nothing changed while signing.
import { turns, type Turn } from '../lib/turns';
import type { Db, Tx } from '../db/client';
import { venuesRepository } from '../db/venues.repository';
import { signOffRepository } from '../db/sign-off.repository';
import { conflict, unprocessable } from '../lib/app-error';
import { groupBy } from '../lib/group-by';
import type { CertifiedReading, DismissedFault } from '../signing/certificate-record';
import { faultsRepository } from '../db/faults.repository';
import { withSpareReadings } from './spare-readings';
import {
  describeIssue,
  venueReadiness,
  type ExceptionInput,
  type ReadinessStripInput,
  type VenueReadiness,
} from '../../shared/domain/readiness';

/** What the database says now: readiness input, and the readings that would be certified. */
export function snapshot(db: Db | Tx, venueId: string) {
  const repo = signOffRepository(db);
  const stripRows = venuesRepository(db).stripsOf(venueId);
  return snapshotOf(stripRows, withSpareReadings(db, repo.stepsWithLatestReading(venueId)), repo.openFaultsOf(venueId));
}

/** Strips whose steps one query reads: some 1 ms on a quiet two-core machine. */
const STRIPS_PER_QUERY = 4;

/**
 * The same snapshot read a few strips at a time, with the event loop's turn between pieces
 * (server/lib/turns.ts): a 120-strip venue's 3,400 steps are some 30 ms in one piece, which
 * readings arriving meanwhile would wait out. It is not one consistent read: sign-off takes the
 * record's fingerprint before it and compares it in its last transaction (sign-off-persist), where
 * a change is looked at in full.
 */
export async function snapshotInTurns(db: Db, venueId: string, turn: Turn = turns()) {
  const repo = signOffRepository(db);
  const stripRows = venuesRepository(db).stripsOf(venueId);
  const ids = repo.stripIdsOf(venueId);
  const rows: ReturnType<typeof repo.stepsWithLatestReading> = [];
  for (let i = 0; i < ids.length; i += STRIPS_PER_QUERY) {
    await turn();
    rows.push(...repo.stepsWithLatestReading(venueId, ids.slice(i, i + STRIPS_PER_QUERY)));
  }
  await turn();
  const withSpares = withSpareReadings(db, rows);
  await turn();
  return snapshotOf(stripRows, withSpares, repo.openFaultsOf(venueId));
}

type StripRow = ReturnType<ReturnType<typeof venuesRepository>['stripsOf']>[number];
type StepRow = ReturnType<ReturnType<typeof signOffRepository>['stepsWithLatestReading']>[number];
type FaultRow = ReturnType<ReturnType<typeof signOffRepository>['openFaultsOf']>[number];

function snapshotOf(stripRows: StripRow[], stepRows: StepRow[], faultRows: FaultRow[]) {
  // Grouped once: a 120-strip venue has some 3,400 steps.
  const stepsOf = groupBy(stepRows, (r) => r.stripId);
  const faultsOf = groupBy(faultRows, (f) => f.stripId);
  const inputs: ReadinessStripInput[] = stripRows.map((s) => ({
    stripId: s.id,
    label: s.label,
    withdrawn: !!s.withdrawnAt,
    withdrawnReason: s.withdrawnReason,
    steps: (stepsOf.get(s.id) ?? []).map((r) => ({
      stepId: r.stepId,
      positionId: r.positionId,
      positionName: r.positionName,
      equipmentId: r.positionEquipmentId,
      assetTag: r.positionAssetTag,
      testKind: r.testKind,
      conductors: r.conductors,
      required: r.required,
      latest: r.reading
        ? {
            readingId: r.reading.id,
            verdict: r.reading.verdict,
            valueText: r.reading.valueText,
            valueOhm: r.reading.valueOhm,
            overRange: r.reading.overRange,
            limitOhm: r.reading.limitOhm,
            limitKind: r.reading.limitKind,
            source: r.reading.source,
            equipmentId: r.reading.equipmentId,
            takenAt: r.reading.takenAt,
            takenByName: r.takenByName ?? '',
          }
        : null,
    })),
    openFaults: (faultsOf.get(s.id) ?? []).map((f) => ({
      faultId: f.faultId,
      positionName: f.positionName,
      kind: f.kind,
      conductors: f.conductors,
      status: f.status,
    })),
  }));
  return { stripRows, stepRows, inputs };
}

/** The ready strips' required steps that have a reading: what the certificates list. */
function certifiable(snap: Snapshot, readiness: VenueReadiness) {
  const ready = new Set(readiness.strips.filter((s) => s.state === 'ready').map((s) => s.stripId));
  const labels = new Map(snap.stripRows.map((s) => [s.id, s.label]));
  return { rows: snap.stepRows.filter((r) => ready.has(r.stripId) && r.required && r.reading), labels };
}

function certified(r: StepRow, labels: Map<string, string>): CertifiedReading {
  const reading = r.reading!;
  return {
    readingId: reading.id,
    stripId: r.stripId,
    stripLabel: labels.get(r.stripId) ?? '',
    position: r.positionName,
    equipmentKind: r.equipmentKind,
    assetTag: r.readingAssetTag ?? r.positionAssetTag,
    testKind: r.testKind,
    conductors: r.conductors,
    valueText: reading.valueText,
    valueOhm: reading.valueOhm,
    overRange: reading.overRange,
    leadNullOhm: reading.leadOffsetOhm,
    leadNullId: reading.leadNullId,
    limitOhm: reading.limitOhm,
    limitKind: reading.limitKind,
    verdict: reading.verdict,
    source: reading.source,
    ruleId: reading.ruleId,
    profileVersion: reading.profileVersion,
    takenById: reading.takenBy,
    takenBy: r.takenByName ?? '',
    takenAt: reading.takenAt,
  };
}

/** The readings the certificates list, in plan order. */
export function certifiedReadings(snap: Snapshot, readiness: VenueReadiness): CertifiedReading[] {
  const { rows, labels } = certifiable(snap, readiness);
  return rows.map((r) => certified(r, labels));
}

/** certifiedReadings, a few milliseconds at a time (3,400 readings of a large venue). */
export async function certifiedReadingsInTurns(snap: Snapshot, readiness: VenueReadiness, turn: Turn = turns()) {
  const { rows, labels } = certifiable(snap, readiness);
  const out: CertifiedReading[] = [];
  for (const r of rows) {
    await turn();
    out.push(certified(r, labels));
  }
  return out;
}

function issuesProblem(readiness: VenueReadiness) {
  return {
    issues: describedIssues(readiness),
    strips: readiness.strips
      .filter((s) => s.state !== 'ready' && s.state !== 'withdrawn' && s.state !== 'exception')
      .map((s) => ({
        stripId: s.stripId,
        label: s.label,
        state: s.state,
        missing: s.missing,
        failing: s.failing,
        openFaults: s.openFaults,
      })),
  };
}

export type Snapshot = ReturnType<typeof snapshot>;

/** The faults of the venue its director dismissed as typing mistakes, on the given strips. */
export function dismissedFaultsOf(db: Db | Tx, venueId: string, stripIds: Set<string>): DismissedFault[] {
  return faultsRepository(db)
    .dismissedOfVenue(venueId)
    .filter((r) => stripIds.has(r.fault.stripId))
    .map((r) => ({
      faultId: r.fault.id,
      stripId: r.fault.stripId,
      stripLabel: r.stripLabel,
      position: r.positionName,
      kind: r.fault.kind,
      conductors: r.fault.conductors,
      openedAt: r.fault.openedAt,
      dismissedById: r.fault.dismissedBy,
      dismissedBy: r.dismissedByName ?? '',
      dismissedAt: r.fault.dismissedAt!,
      reason: r.fault.dismissedReason ?? '',
    }));
}

/** The snapshot and its readiness, with the strips left out at sign-off. */
export function readinessOf(db: Db | Tx, venueId: string, exceptions: ExceptionInput[] = []) {
  const snap = snapshot(db, venueId);
  return { snap, readiness: venueReadiness(snap.inputs, exceptions) };
}

/** The readiness answer's issues, each with its sentence. */
export const describedIssues = (readiness: VenueReadiness) => readiness.issues.map((i) => ({ ...i, message: describeIssue(i) }));

/** The snapshot read in turns (snapshotInTurns) and its readiness. */
export async function readinessInTurns(db: Db, venueId: string, exceptions: ExceptionInput[] = [], turn: Turn = turns()) {
  const snap = await snapshotInTurns(db, venueId, turn);
  await turn();
  return { snap, readiness: venueReadiness(snap.inputs, exceptions) };
}

/** Ready to sign with these exceptions, else 422 (an exception names no strip of the venue) or 409 (not ready). */
export async function requireReady(db: Db, venueId: string, exceptions: ExceptionInput[], turn: Turn = turns()) {
  const { snap, readiness } = await readinessInTurns(db, venueId, exceptions, turn);
  const known = new Set(snap.stripRows.map((s) => s.id));
  const unknown = exceptions.filter((e) => !known.has(e.stripId));
  if (unknown.length > 0) {
    throw unprocessable('unknown-strip', 'An exception names a strip that is not in this venue.', {
      errors: unknown.map((e) => ({ path: `exceptions.${exceptions.indexOf(e)}.stripId`, message: 'Not a strip of this venue.' })),
    });
  }
  if (!readiness.ready) {
    throw conflict('not-ready', 'The venue is not ready to sign off: some readings are missing or failing.', issuesProblem(readiness));
  }
  return { snap, readiness };
}
