// The invented demo scenario of the product brief: Lakeshore Fencing League, Autumn Cup 2026,
// Riverside Sports Hall part-way through testing (with a located A–B short) and Riverside Annex
// fully tested and ready to sign off. Runs once: an existing organisation means nothing is done.
import { eq } from 'drizzle-orm';
import type { Db, Tx } from './client';
import * as t from './schema';
import { hashPassword, type ScryptParams } from '../auth/password';
import { newId, sha256Hex } from '../lib/ids';
import { DEFAULT_LIMIT_PROFILE, type EquipmentKind } from '../../shared/domain/limits';
import { judgeTypedReading } from '../../shared/domain/typed-reading';
import { locateByLoopBothEnds } from '../../shared/domain/fault-location';
import { FLOOR_CABLE_M, itemMaker, makeVenue, REEL_M, type SeedPosition } from './seed-demo-plan';

export const DEMO_ORG_NAME = 'Lakeshore Fencing League';
export const DEMO_PASSWORD = 'demo-strip-2026';

const PEOPLE = [
  { key: 'ada', name: 'Ada Quill', role: 'admin' },
  { key: 'nina', name: 'Nina Okafor', role: 'organiser' },
  { key: 'marco', name: 'Marco Dal Bello', role: 'director' },
  { key: 'sam', name: 'Sam Reyes', role: 'technician' },
  { key: 'lee', name: 'Lee Varga', role: 'technician' },
] as const;

// Typical values for the demo only (invented): Ω per conductor per metre.
const FLOOR_OHM_PER_M = 0.0375;
const REEL_OHM_PER_M = 0.06;

type Plan = Record<string, string>; // "<strip>|<position>|<testKind>|<conductors>" → value as typed

/** Deterministic variation so the demo looks like real readings. */
function jitter(i: number, spread: number): number {
  const x = Math.sin(i * 12.9898) * 43758.5453;
  return (x - Math.floor(x) - 0.5) * spread;
}

export async function seedDemo(db: Db, scrypt: ScryptParams): Promise<boolean> {
  if (db.select().from(t.organisations).where(eq(t.organisations.name, DEMO_ORG_NAME)).get()) return false;
  const hash = await hashPassword(DEMO_PASSWORD, scrypt);
  db.transaction((tx) => {
    // Checked again inside the transaction so two starts at once seed once.
    if (tx.select().from(t.organisations).where(eq(t.organisations.name, DEMO_ORG_NAME)).get()) return;
    build(tx, hash);
  });
  return true;
}

/** The organisation, its people, the shipped limit profile and the event. */
function seedOrganisation(tx: Tx, passwordHash: string) {
  const orgId = newId();
  tx.insert(t.organisations).values({ id: orgId, name: DEMO_ORG_NAME }).run();
  const user: Record<string, string> = {};
  for (const p of PEOPLE) {
    user[p.key] = newId();
    tx.insert(t.users)
      .values({ id: user[p.key], orgId, email: `${p.key}@lakeshore.example`, name: p.name, role: p.role, passwordHash })
      .run();
  }

  const profileId = newId();
  tx.insert(t.limitProfiles)
    .values({
      id: profileId,
      orgId,
      lineageId: newId(),
      name: DEFAULT_LIMIT_PROFILE.name,
      version: DEFAULT_LIMIT_PROFILE.version,
      rulesJson: JSON.stringify(DEFAULT_LIMIT_PROFILE.rules),
      loopRequiredJson: JSON.stringify(DEFAULT_LIMIT_PROFILE.loopRequired ?? []),
      notes: 'Shipped with Stripwarden. Copy it to make your own; edits create a new version.',
      createdBy: user.ada,
    })
    .run();

  const eventId = newId();
  tx.insert(t.events)
    .values({
      id: eventId,
      orgId,
      name: 'Autumn Cup 2026',
      startsOn: '2026-11-21',
      endsOn: '2026-11-22',
      directorId: user.marco,
      organiserId: user.nina,
    })
    .run();

  return { orgId, user, profileId, eventId };
}

function build(tx: Tx, passwordHash: string) {
  const { orgId, user, profileId, eventId } = seedOrganisation(tx, passwordHash);
  const makeItem = itemMaker(tx, orgId);
  const hall = makeVenue(tx, {
    eventId,
    profileId,
    name: 'Riverside Sports Hall',
    technician: user.sam,
    strips: Array.from({ length: 24 }, (_, i) => ({
      label: `Strip ${i + 1}`,
      zone: `Row ${'ABC'[Math.floor(i / 8)]}`,
      conductive: i < 8,
    })),
    makeItem,
  });
  const annex = makeVenue(tx, {
    eventId,
    profileId,
    name: 'Riverside Annex',
    technician: user.lee,
    strips: Array.from({ length: 4 }, (_, i) => ({ label: `Annex ${i + 1}`, zone: 'Annex', conductive: false })),
    makeItem,
  });

  recordDemoReadings(tx, { orgId, hall, annex, profileId, sam: user.sam, lee: user.lee });
  tx.update(t.venues).set({ status: 'testing' }).where(eq(t.venues.id, hall.id)).run();
  tx.update(t.venues).set({ status: 'testing' }).where(eq(t.venues.id, annex.id)).run();
}

/** Sports Hall strips 1–10 tested (with the failures the faults come from), strip 11 half done; the annex all done. */
function recordDemoReadings(
  tx: Tx,
  v: {
    orgId: string;
    hall: ReturnType<typeof makeVenue>;
    annex: ReturnType<typeof makeVenue>;
    profileId: string;
    sam: string;
    lee: string;
  },
) {
  const { hall, annex, profileId } = v;
  // Sports Hall: strips 1–10 tested, strip 11 half done, the rest not started.
  const hallPlan: Plan = {
    'Strip 2|Left floor cable|continuity|A': '2.31', // near limit (over 90 % of 2.5 Ω)
    'Strip 3|Right reel|continuity|B': '3.4', // over the 3 Ω reel limit
    'Strip 5|Piste|piste-end-to-end|piste': '6.2', // over the 5 Ω piste limit
    'Strip 9|Left reel|continuity|C': 'OL', // open conductor
  };
  // The A–B short on Strip 6's left floor cable, 7.4 m from the apparatus end, 0.3 Ω in the fault.
  const shortAt = 7.4;
  const shortOhm = 0.3;
  const near = 2 * FLOOR_OHM_PER_M * shortAt + shortOhm;
  const far = 2 * FLOOR_OHM_PER_M * (FLOOR_CABLE_M - shortAt) + shortOhm;
  hallPlan['Strip 6|Left floor cable|insulation|A-B'] = near.toFixed(3);

  let n = 0;
  const takenAt = (minutes: number) => new Date(Date.parse('2026-11-21T06:40:00Z') + minutes * 60_000).toISOString();
  const record = (
    venue: typeof hall,
    stripFilter: (i: number) => boolean,
    plan: Plan,
    by: string,
    halfStrip?: number,
    leadNull?: { id: string; valueOhm: number },
  ) => {
    venue.strips.forEach((strip, si) => {
      const partial = si === halfStrip;
      if (!stripFilter(si) && !partial) return;
      strip.positions.forEach((pos, pi) => {
        if (partial && pi > 2) return;
        for (const step of pos.steps) {
          n += 1;
          const key = `${strip.label}|${pos.name}|${step.testKind}|${step.conductors}`;
          const typed = plan[key] ?? typicalValue(pos.kind, step.testKind, n);
          const readingId = insertReading(tx, {
            step,
            equipmentId: pos.equipmentId,
            lengthM: pos.lengthM,
            kind: pos.kind,
            typed,
            profileId,
            takenBy: by,
            takenAt: takenAt(si * 9 + pi * 1.5 + n * 0.01),
            leadNull,
          });
          if (plan[key] && step.testKind !== 'loop' && readingId.verdict === 'fail') {
            openFault(tx, { strip, pos, step, readingId: readingId.id, by, typed, near, far });
          }
        }
      });
    });
  };
  record(hall, (i) => i < 10, hallPlan, v.sam, 10);
  // Lee nulled the test leads before testing the Annex; every Annex reading has it subtracted.
  const leeNull = { id: newId(), valueOhm: 0.05 };
  tx.insert(t.leadNulls)
    .values({
      ...leeNull,
      orgId: v.orgId,
      takenBy: v.lee,
      valueText: '0.05',
      meter: 'Meter 2',
      takenAt: takenAt(-5),
      receivedAt: takenAt(-5),
    })
    .run();
  record(annex, () => true, {}, v.lee, undefined, leeNull);
}

function typicalValue(kind: EquipmentKind, testKind: string, i: number): string {
  const perM = kind === 'reel' ? REEL_OHM_PER_M : FLOOR_OHM_PER_M;
  const len = kind === 'reel' ? REEL_M : FLOOR_CABLE_M;
  switch (testKind) {
    case 'continuity':
      return (perM * len + 0.05 + jitter(i, 0.1)).toFixed(2);
    case 'loop':
      return (2 * perM * len + 0.08 + jitter(i, 0.12)).toFixed(2);
    case 'insulation':
      return i % 5 === 0 ? `${(40 + Math.round(jitter(i, 30))).toString()} MΩ` : 'OL';
    case 'piste-end-to-end':
      return (1.2 + jitter(i, 0.8)).toFixed(2);
    case 'piste-earth':
      return (0.4 + jitter(i, 0.3)).toFixed(2);
    default:
      return 'OL';
  }
}

function insertReading(
  tx: Tx,
  r: {
    step: SeedPosition['steps'][number];
    equipmentId: string;
    lengthM: number | null;
    kind: EquipmentKind;
    typed: string;
    profileId: string;
    takenBy: string;
    takenAt: string;
    leadNull: { id: string; valueOhm: number } | undefined;
  },
) {
  const judged = judgeTypedReading(
    r.typed,
    { profile: DEFAULT_LIMIT_PROFILE, equipmentKind: r.kind, testKind: r.step.testKind, conductors: r.step.conductors, lengthM: r.lengthM },
    r.leadNull?.valueOhm ?? null,
  );
  if (!judged.ok) throw new Error(`demo reading "${r.typed}" is refused: ${judged.message}`);
  const verdict = judged.verdict;
  const id = newId();
  tx.insert(t.readings)
    .values({
      id,
      stepId: r.step.id,
      equipmentId: r.equipmentId,
      valueText: r.typed,
      valueOhm: judged.valueOhm,
      overRange: judged.overRange,
      leadOffsetOhm: judged.leadNullOhm,
      leadNullId: r.leadNull?.id ?? null,
      verdict: verdict.verdict,
      limitOhm: verdict.limitOhm,
      limitKind: verdict.limitKind,
      source: verdict.source,
      ruleId: verdict.ruleId,
      profileId: r.profileId,
      profileVersion: DEFAULT_LIMIT_PROFILE.version,
      explanation: verdict.explanation,
      requestHash: sha256Hex(JSON.stringify({ stepId: r.step.id, value: r.typed })),
      takenBy: r.takenBy,
      takenAt: r.takenAt,
    })
    .run();
  return { id, verdict: verdict.verdict };
}

function openFault(
  tx: Tx,
  f: {
    strip: { id: string };
    pos: SeedPosition;
    step: SeedPosition['steps'][number];
    readingId: string;
    by: string;
    typed: string;
    near: number;
    far: number;
  },
) {
  const kind = f.step.testKind === 'insulation' ? 'short' : f.typed === 'OL' ? 'open' : 'high-resistance';
  const faultId = newId();
  const located = kind === 'short';
  tx.insert(t.faults)
    .values({
      id: faultId,
      stripId: f.strip.id,
      positionId: f.pos.id,
      equipmentId: f.pos.equipmentId,
      stepId: f.step.id,
      readingId: f.readingId,
      kind,
      conductors: f.step.conductors,
      status: located ? 'located' : 'open',
      openedBy: f.by,
      openedAt: '2026-11-21T07:35:00.000Z',
    })
    .run();
  if (!located) return;
  const inputs = {
    nearOhm: Number(f.near.toFixed(3)),
    farOhm: Number(f.far.toFixed(3)),
    lengthM: FLOOR_CABLE_M,
    ohmPerMetre: FLOOR_OHM_PER_M,
  };
  const estimate = locateByLoopBothEnds(inputs);
  tx.insert(t.faultEstimates)
    .values({
      id: newId(),
      faultId,
      method: 'loop-both-ends',
      fromEnd: 'near',
      inputsJson: JSON.stringify(inputs),
      distanceM: estimate.distanceM,
      uncertaintyM: estimate.uncertaintyM,
      resultJson: JSON.stringify(estimate),
      itemLengthM: FLOOR_CABLE_M,
      createdBy: f.by,
      createdAt: '2026-11-21T07:48:00.000Z',
    })
    .run();
}
