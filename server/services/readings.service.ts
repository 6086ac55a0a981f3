// Recording a reading: the server is the authority. It parses what was typed, judges it against the
// venue's limit profile, stores the verdict with the profile version, opens a fault on a failure
// and closes a repaired fault once its retest passes. A correction never closes a fault: a fault
// that was a typing mistake is dismissed by the event's director (faults.service.ts).
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import type { Db, Tx } from '../db/client';
import { readingsRepository, type ReadingWriteContext } from '../db/readings.repository';
import { stripsRepository, latestByStep, type ReadingRow } from '../db/strips.repository';
import { faultsRepository } from '../db/faults.repository';
import { recordAudit } from '../db/audit.repository';
import { groupCommit, type WriteQueue } from '../db/group-commit';
import { accessService } from './access.service';
import { suspendStripIfSignedOff } from './venue-lifecycle';
import { limitProfileById } from './profiles.service';
import { conflict, notFound, unprocessable } from '../lib/app-error';
import { newId, nowIso, sha256Hex } from '../lib/ids';
import { decideTakenAt } from '../../shared/domain/reading-time';
import { judgeTypedReading } from '../../shared/domain/typed-reading';
import type { CreateReadingInput, ReadingDto } from '../../shared/schemas/readings';
import type { FaultKind } from '../../shared/schemas/faults';
import { presentReading } from '../presenters/readings';

/**
 * What tells a replay from a different request: the body, normalised, without the id. The
 * tablet's takenAt is left out: the queue resends the same body, and the stamp is not the reading.
 */
function requestHash(body: CreateReadingInput): string {
  return sha256Hex(
    JSON.stringify({
      stepId: body.stepId,
      value: body.value.trim(),
      // Readings once carried the offset itself (always null now): kept so a reading stored before
      // lead nulls were records still replays as itself.
      leadOffsetOhm: null,
      temperatureC: body.temperatureC ?? null,
      supersedesId: body.supersedesId ?? null,
      correctionReason: body.correctionReason ?? null,
      ...(body.leadNullId ? { leadNullId: body.leadNullId } : {}),
    }),
  );
}

function faultKindFor(testKind: string, overRange: boolean): FaultKind {
  if (testKind === 'insulation') return 'short';
  return overRange ? 'open' : 'high-resistance';
}

export interface CreatedReading {
  replayed: boolean;
  reading: ReadingDto;
}

interface Scope {
  deps: AppDeps;
  access: ReturnType<typeof accessService>;
}

function faultIdFor(tx: Db | Tx, r: ReadingRow): string | null {
  const faults = faultsRepository(tx);
  if (r.verdict !== 'fail') return faults.ofReading(r.id)?.id ?? null;
  return faults.ofReading(r.id)?.id ?? faults.unclosedOfStep(r.stepId)?.id ?? null;
}

function get({ deps, access }: Scope, user: AuthUser, id: string): ReadingDto {
  const row = readingsRepository(deps.db).findById(id);
  if (!row) throw notFound('That reading');
  const ctx = stripsRepository(deps.db).stepContext(row.reading.stepId);
  if (!ctx) throw notFound('That reading');
  access.requireVenue(user, ctx.venue.id, 'read');
  return presentReading(row.reading, row.takenByName, faultIdFor(deps.db, row.reading));
}

/** The same id again: the stored reading if the body is the same, a refusal if it is not. */
function replay(db: Db, body: CreateReadingInput, hash: string, storedHash: string): CreatedReading {
  if (storedHash !== hash) {
    throw unprocessable(
      'idempotency-mismatch',
      'A reading with this id was already recorded with different content. Make a new id for a new reading.',
      { errors: [{ path: 'id', message: 'This id belongs to a different reading' }] },
    );
  }
  const existing = readingsRepository(db).findById(body.id)!;
  return { replayed: true, reading: presentReading(existing.reading, existing.takenByName, faultIdFor(db, existing.reading)) };
}

/**
 * A step taken off the checklist takes no reading (409); a correction names an earlier reading of
 * the same step, and a test-lead null is one the caller recorded (422). Answers the null's ohms.
 */
function checkWritable(db: Db, ctx: ReadingWriteContext, body: CreateReadingInput, leadNullId: string | null): number | null {
  if (ctx.step.removedAt) {
    throw conflict(
      'step-removed',
      `This step (${ctx.step.testKind} ${ctx.step.conductors} on ${ctx.position.name}, ${ctx.strip.label}) was taken off the checklist; the reading was not recorded.`,
      { stepId: ctx.step.id },
    );
  }
  let leadNullOhm = leadNullId === null ? null : ctx.leadNullOhm;
  if (body.supersedesId) {
    const old = readingsRepository(db).findById(body.supersedesId);
    if (!old || old.reading.stepId !== body.stepId) {
      throw unprocessable('bad-correction', 'The reading being corrected must be an earlier reading of the same step.', {
        errors: [{ path: 'supersedesId', message: 'Not a reading of this step' }],
      });
    }
    // A correction fixes what was typed, not the measurement: it may keep the null the
    // corrected reading used, whoever measured it.
    if (leadNullId !== null && leadNullOhm === null && old.reading.leadNullId === leadNullId) leadNullOhm = old.reading.leadOffsetOhm;
  }
  if (leadNullId !== null && leadNullOhm === null) {
    throw unprocessable(
      'unknown-lead-null',
      'That test-lead null is not one you recorded. Null the leads again on the testing screen, then record the reading.',
      {
        errors: [{ path: 'leadNullId', message: 'Not a test-lead null of yours' }],
      },
    );
  }
  return leadNullOhm;
}

/** What was typed, less the test-lead null, and its verdict against the venue's limit profile; refusals are 422 / 409. */
function judge(db: Db, ctx: ReadingWriteContext, body: CreateReadingInput, leadNullOhm: number | null) {
  const profile = limitProfileById(db, ctx.venue.profileId);
  if (!profile) throw conflict('no-limit-profile', 'This venue has no limit profile; the technical director must choose one.');
  const judged = judgeTypedReading(
    body.value,
    {
      profile,
      equipmentKind: ctx.position.equipmentKind,
      testKind: ctx.step.testKind,
      conductors: ctx.step.conductors,
      lengthM: ctx.lengthM,
      temperatureC: body.temperatureC ?? null,
    },
    leadNullOhm,
  );
  if (!judged.ok) throw unprocessable(judged.code, judged.message, { errors: [{ path: judged.field, message: judged.message }] });
  return { profile, judged, verdict: judged.verdict };
}

/** The reading row, written with its audit entry; takenAt as the tablet stamped it, within limits. */
function storeReading(
  db: Db,
  user: AuthUser,
  ctx: ReadingWriteContext,
  body: CreateReadingInput,
  hash: string,
  judgement: ReturnType<typeof judge>,
  lead: { id: string | null; ohm: number | null },
) {
  const { judged, profile, verdict } = judgement;
  const receivedAt = nowIso();
  const time = decideTakenAt(body.takenAt, receivedAt);
  const takenAt = time.takenAt;
  const row: ReadingRow = {
    id: body.id,
    stepId: body.stepId,
    equipmentId: ctx.position.equipmentId,
    valueText: body.value,
    valueOhm: judged.valueOhm,
    overRange: judged.overRange,
    leadOffsetOhm: judged.leadNullOhm,
    leadNullId: lead.id,
    temperatureC: body.temperatureC ?? null,
    verdict: verdict.verdict,
    limitOhm: verdict.limitOhm,
    limitKind: verdict.limitKind,
    source: verdict.source,
    ruleId: verdict.ruleId,
    profileId: ctx.venue.profileId,
    profileVersion: profile.version,
    explanation: verdict.explanation,
    supersedesId: body.supersedesId ?? null,
    correctionReason: body.correctionReason ?? null,
    requestHash: hash,
    takenBy: user.id,
    takenAt,
    receivedAt,
  };
  readingsRepository(db).insert(row);
  recordAudit(db, user, body.supersedesId ? 'reading.corrected' : 'reading.recorded', 'reading', body.id, {
    stepId: body.stepId,
    stripId: ctx.strip.id,
    value: body.value,
    ...(lead.id ? { leadNullId: lead.id, leadNullOhm: lead.ohm } : {}),
    verdict: verdict.verdict,
    profileVersion: profile.version,
    ...(body.supersedesId ? { supersedesId: body.supersedesId, reason: body.correctionReason } : {}),
    // The tablet's own time is kept here even when it was not believed (nothing typed is lost).
    ...(time.source === 'tablet' && takenAt !== receivedAt ? { takenAt, receivedAt } : {}),
    ...('refused' in time ? { tabletTakenAt: time.refused.claimed, tabletClock: time.refused.why } : {}),
  });
  return row;
}

/**
 * Records a reading. Answers `replayed: true` with the stored reading when the same id comes
 * again with the same body (an offline client retrying). Settles once the reading is durable:
 * readings arriving together share one commit (server/db/group-commit.ts), and everything below
 * runs inside it, so what the write reads (the venue's state, the step's faults) is current.
 * `queue`: a batch of the group commit when the reading came in one (createBatch).
 */
function create(
  { deps, access }: Scope,
  user: AuthUser,
  body: CreateReadingInput,
  queue: WriteQueue = groupCommit(deps.sqlite),
): Promise<CreatedReading> {
  const hash = requestHash(body);
  return queue.run(() => {
    const db = deps.db;
    const leadNullId = body.leadNullId ?? null;
    const ctx = readingsRepository(db).writeContext(body.stepId, user.id, body.id, leadNullId);
    if (!ctx) throw notFound('That step');
    access.requireLoadedVenue(user, ctx, 'test', ctx.assigned);
    if (ctx.existingHash !== null) return replay(db, body, hash, ctx.existingHash);
    const leadNullOhm = checkWritable(db, ctx, body, leadNullId);
    const judgement = judge(db, ctx, body, leadNullOhm);
    const row = storeReading(db, user, ctx, body, hash, judgement, { id: leadNullId, ohm: leadNullOhm });
    // The venue's status was read in this transaction: only a signed-off venue's strip is suspended.
    // Told only when this reading took the strip out: a retest on a strip already out is expected.
    const stripSuspended =
      ctx.venue.status === 'signed-off' &&
      !ctx.strip.outOfServiceSince &&
      suspendStripIfSignedOff(db, {
        venueId: ctx.venue.id,
        stripId: ctx.strip.id,
        orgId: user.orgId,
        actorId: user.id,
        reason: `New reading on ${ctx.strip.label}, ${ctx.position.name}`,
      });
    const faultId =
      judgement.verdict.verdict === 'fail'
        ? onFailure(db, user, ctx, body.id, judgement.judged.overRange, row.takenAt)
        : onPass(db, user, ctx, body, row.takenAt);
    // Answered from the row just inserted (every column is set above), not read back.
    const reading = presentReading(row, user.name, faultId);
    // Tell the tablet: a reading that waited offline may have landed on a venue signed off meanwhile.
    if (stripSuspended) reading.stripSuspended = true;
    return { replayed: false, reading };
  });
}

/**
 * Readings sent together (a tablet's queue after time offline): each goes through create() and
 * so is judged and stored exactly as if it came alone, in the order given, and all of them share
 * one COMMIT. Settles once that commit has returned, with each reading's own outcome; rejects
 * when the commit failed (then none of them is stored).
 */
async function createBatch(scope: Scope, user: AuthUser, bodies: CreateReadingInput[]): Promise<PromiseSettledResult<CreatedReading>[]> {
  const batch = groupCommit(scope.deps.sqlite).batch();
  const outcomes = Promise.allSettled(bodies.map((body) => create(scope, user, body, batch)));
  await batch.submit();
  return outcomes;
}

/** Opens a fault unless one is already open on this step; a failed retest sends a repaired fault back to open. */
function onFailure(tx: Db, user: AuthUser, ctx: ReadingWriteContext, readingId: string, overRange: boolean, at: string): string {
  const faults = faultsRepository(tx);
  const existing = ctx.unclosedFaultId ? faults.unclosedOfStep(ctx.step.id) : undefined;
  if (existing) {
    if (existing.status === 'repaired') {
      faults.update(existing.id, existing.version, { status: 'open' });
      recordAudit(tx, user, 'fault.retest-failed', 'fault', existing.id, { readingId });
    }
    return existing.id;
  }
  const id = newId();
  const kind = faultKindFor(ctx.step.testKind, overRange);
  faults.insert({
    id,
    stripId: ctx.strip.id,
    positionId: ctx.position.id,
    equipmentId: ctx.position.equipmentId,
    stepId: ctx.step.id,
    readingId,
    kind,
    conductors: ctx.step.conductors,
    status: 'open',
    openedBy: user.id,
    openedAt: at,
  });
  recordAudit(tx, user, 'fault.opened', 'fault', id, { readingId, kind, conductors: ctx.step.conductors, automatic: true });
  return id;
}

/**
 * A passing reading may finish a retest: a repaired fault closes when every active step of its
 * position has a passing reading taken since the repair. A correction closes nothing, and is no
 * retest either (it is typed now but fixes a value measured before): the reading that opened a
 * fault may be corrected to a pass, but the fault stays open until it is repaired and measured
 * again, or dismissed by the event's director.
 */
function onPass(tx: Db, user: AuthUser, ctx: ReadingWriteContext, body: CreateReadingInput, at: string): string | null {
  const positionId = ctx.position.id;
  const faults = faultsRepository(tx);
  const strips = stripsRepository(tx);
  // Most passes finish no retest: the context already says whether a repaired fault waits here.
  if (!ctx.hasRepairedFault || body.supersedesId) return null;
  const repaired = faults.repairedOfPosition(positionId);
  if (repaired.length === 0) return null;
  const steps = strips.activeStepsOf([positionId]);
  const latest = latestByStep(strips.readingsOfSteps(steps.map((s) => s.id)));
  for (const fault of repaired) {
    const repairedAt = faults.latestRepairOf(fault.id)?.createdAt ?? fault.openedAt;
    const allPass = steps.every((s) => {
      const r = latest.get(s.id)?.reading;
      return !!r && r.verdict !== 'fail' && r.supersedesId === null && r.takenAt >= repairedAt;
    });
    if (!allPass) continue;
    faults.update(fault.id, fault.version, { status: 'closed', closedAt: at });
    recordAudit(tx, user, 'fault.closed', 'fault', fault.id, { why: 'retest passed', readingId: body.id });
  }
  return null;
}

export function readingsService(deps: AppDeps) {
  const scope: Scope = { deps, access: accessService(deps.db) };
  // Written out rather than bound generically: the reading write is the hot path.
  return {
    create: (user: AuthUser, body: CreateReadingInput, queue?: WriteQueue) => create(scope, user, body, queue),
    createBatch: (user: AuthUser, bodies: CreateReadingInput[]) => createBatch(scope, user, bodies),
    get: (user: AuthUser, id: string) => get(scope, user, id),
  };
}
