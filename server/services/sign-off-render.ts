// Sign-off, step two: the certificates in memory. A number for the venue and for each ready strip,
// the payload of each, signed (Ed25519 JWS) and rendered to PDF; nothing is written yet.
import { turns, type Turn } from '../lib/turns';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import type { AuthUser } from '../auth/types';
import type { VenueCtx } from './plan-edit';
import { certificatesRepository } from '../db/certificates.repository';
import type { SignOffRepository } from '../db/sign-off.repository';
import { sha256Hex } from '../lib/ids';
import { groupBy } from '../lib/group-by';
import { signCertificatePayload, type SigningKey } from '../signing/signing-keys';
import {
  CERTIFICATE_FORMAT,
  SCOPE_SENTENCE,
  newCertificateNumber,
  readingsDigest,
  verifyUrlFor,
  type CertificateItem,
  type CertificatePayload,
  type CertifiedLeadNull,
  type CertifiedReading,
  type DismissedFault,
} from '../signing/certificate-record';
import { leadNullsRepository } from '../db/lead-nulls.repository';
import { venuesRepository } from '../db/venues.repository';
import type { Snapshot } from './sign-off-readiness';
import { temperatureRuleText, type LimitRule } from '../../shared/domain/limits';
import type { StripReadiness, VenueReadiness } from '../../shared/domain/readiness';
import { formatOhm } from '../../shared/domain/units';
import type { CertificateKind } from '../../shared/domain/certificate-number';

export const DEFAULT_STATEMENT = 'I have reviewed the readings listed in this certificate and sign the venue off for competition.';

/** The limit of a rule in words, for the certificate's list of limits and sources. */
export function ruleLimitText(r: LimitRule): string {
  const parts: string[] = [];
  if (r.maxOhm !== undefined) parts.push(`max ${formatOhm(r.maxOhm)}`);
  if (r.maxOhmPerMetre !== undefined)
    parts.push(`max ${formatOhm(r.maxOhmPerMetre)}/m${r.connectorAllowanceOhm ? ` + ${formatOhm(r.connectorAllowanceOhm)}` : ''}`);
  if (r.minOhm !== undefined) parts.push(`min ${formatOhm(r.minOhm)}`);
  if (r.nearLimitFraction !== undefined) parts.push(`near limit above ${Math.round(r.nearLimitFraction * 100)} %`);
  if (r.nearMinOhm !== undefined) parts.push(`near limit below ${formatOhm(r.nearMinOhm)}`);
  return parts.join(', ') || 'no value';
}

/** Who signs what, and when: everything a payload names besides its readings. */
export interface SigningContext {
  row: VenueCtx;
  signer: AuthUser & { displayName: string };
  organisation: { id: string; name: string };
  profile: NonNullable<ReturnType<SignOffRepository['profile']>>;
  signedAt: string;
  statement: string;
  origin: string;
  /** Faults of the certified strips the director dismissed as typing mistakes. */
  dismissed: DismissedFault[];
}

/** The test-lead nulls the readings used, each with who measured it, when and how many readings used it. */
function leadNullsOf(db: Db, list: CertifiedReading[]): CertifiedLeadNull[] {
  const uses = new Map<string, number>();
  for (const r of list) if (r.leadNullId) uses.set(r.leadNullId, (uses.get(r.leadNullId) ?? 0) + 1);
  return leadNullsRepository(db)
    .byIds([...uses.keys()])
    .map(({ leadNull: n, takenByName }) => ({
      id: n.id,
      valueOhm: n.valueOhm,
      takenById: n.takenBy,
      takenBy: takenByName ?? '',
      takenAt: n.takenAt,
      meter: n.meter,
      readings: uses.get(n.id) ?? 0,
    }))
    .sort((a, b) => a.takenAt.localeCompare(b.takenAt) || a.id.localeCompare(b.id));
}

export interface Draft {
  payload: CertificatePayload;
  readings: CertifiedReading[];
  stripId: string | null;
}

export interface IssuedCertificate extends Draft {
  canonical: string;
  jws: string;
  pdf: Buffer;
  sha256: string;
}

/**
 * A number for the venue and for each ready strip, none of them given out before nor repeated.
 * 40 random bits each make a clash all but unheard of; a number that clashes is drawn again.
 */
export function allocateNumbers(
  db: Db,
  year: number,
  readiness: { strips: Pick<StripReadiness, 'stripId' | 'label' | 'state'>[] },
  draw: (kind: CertificateKind, year: number) => string = newCertificateNumber,
) {
  const ready = readiness.strips.filter((s) => s.state === 'ready');
  const kindAt = (i: number): CertificateKind => (i === 0 ? 'venue' : 'strip');
  let numbers = [draw('venue', year), ...ready.map(() => draw('strip', year))];
  for (;;) {
    const taken = certificatesRepository(db).numbersTaken(numbers);
    const clashes = (n: string, i: number) => taken.has(n) || numbers.indexOf(n) !== i;
    if (!numbers.some(clashes)) break;
    numbers = numbers.map((n, i) => (clashes(n, i) ? draw(kindAt(i), year) : n));
  }
  return {
    venueNumber: numbers[0]!,
    stripNumbers: ready.map((s, i) => ({ stripId: s.stripId, label: s.label, number: numbers[i + 1]! })),
  };
}

type PayloadBase = Omit<CertificatePayload, 'number' | 'kind' | 'exceptions' | 'related' | 'verifyUrl'>;
type Planned = Map<string, { position: string; kind: string; assetTag: string | null }[]>;

/** Each strip's positions in plan order with the item in each, measured or not (the apparatus is not). */
function plannedItems(db: Db, stripIds: string[]): Planned {
  const out: Planned = new Map();
  for (const { position, equipment } of venuesRepository(db).positionsOf(stripIds)) {
    const list = out.get(position.stripId) ?? [];
    list.push({ position: position.name, kind: position.equipmentKind, assetTag: equipment?.assetTag ?? null });
    out.set(position.stripId, list);
  }
  return out;
}

/** The strip's items: every planned position, marked measured when certified readings name it. */
function itemsOf(own: CertifiedReading[], planned: ReturnType<Planned['get']>): CertificateItem[] {
  const key = (position: string, assetTag: string | null) => `${position}|${assetTag}`;
  const measured = new Map<string, CertificateItem>();
  for (const r of own)
    measured.set(key(r.position, r.assetTag), { position: r.position, kind: r.equipmentKind, assetTag: r.assetTag, measured: true });
  const items = (planned ?? []).map((p) => measured.get(key(p.position, p.assetTag)) ?? { ...p, measured: false });
  // A certified reading always names a planned position; kept here too should the plan say otherwise.
  for (const [k, item] of measured) if (!items.some((i) => key(i.position, i.assetTag) === k)) items.push(item);
  return items;
}

/** What a certificate says about its readings: strips, items, testers, the digest, the profile. */
async function payloadBase(
  db: Db,
  ctx: SigningContext,
  list: CertifiedReading[],
  zoneOf: Map<string, string | null>,
  planned: Planned,
  turn: Turn,
): Promise<PayloadBase> {
  const testers = new Map(list.map((r) => [r.takenById, r.takenBy]));
  const times = list.map((r) => r.takenAt).sort();
  const strips = [...groupBy(list, (r) => r.stripId)].map(([stripId, own]) => {
    return {
      id: stripId,
      label: own[0].stripLabel,
      zone: zoneOf.get(stripId) ?? null,
      items: itemsOf(own, planned.get(stripId)),
      readings: own.length,
      nearLimit: own.filter((r) => r.verdict === 'near-limit').length,
    };
  });
  const { row, profile } = ctx;
  const rules = JSON.parse(profile.rulesJson) as LimitRule[];
  return {
    format: CERTIFICATE_FORMAT,
    issuer: { name: 'Stripwarden' as const, origin: ctx.origin, organisation: ctx.organisation },
    event: { id: row.event.id, name: row.event.name, startsOn: row.event.startsOn, endsOn: row.event.endsOn },
    venue: { id: row.venue.id, name: row.venue.name },
    strips,
    items: [...new Set(list.map((r) => r.assetTag).filter((t): t is string => !!t))].sort(),
    readings: {
      count: list.length,
      nearLimit: list.filter((r) => r.verdict === 'near-limit').length,
      digestAlg: 'SHA-256' as const,
      digest: await readingsDigest(list, turn),
    },
    profile: {
      id: profile.id,
      name: profile.name,
      version: profile.version,
      rules: rules.map((r) => ({ id: r.id, source: r.source, limit: ruleLimitText(r), note: r.note ?? null })),
      temperature: temperatureRuleText(profile),
    },
    testedBy: [...testers].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name)),
    leadNulls: leadNullsOf(db, list),
    dismissedFaults: ctx.dismissed.filter((f) => strips.some((s) => s.id === f.stripId)),
    testedFrom: times[0],
    testedTo: times[times.length - 1],
    signer: { id: ctx.signer.id, name: ctx.signer.displayName, role: 'Technical director' as const },
    signedAt: ctx.signedAt,
    statement: ctx.statement,
    scope: SCOPE_SENTENCE,
  };
}

/**
 * The venue certificate (every certified reading, the exceptions) and one per ready strip, with
 * the event loop's turn every few milliseconds (server/lib/turns.ts): a 120-strip venue is some
 * 50 ms of hashing, which readings arriving meanwhile would otherwise wait out in one piece.
 */
export async function draftCertificates(
  db: Db,
  ctx: SigningContext,
  snap: Snapshot,
  readiness: VenueReadiness,
  readings: CertifiedReading[],
  turn: Turn = turns(),
): Promise<Draft[]> {
  const { venueNumber, stripNumbers } = allocateNumbers(db, new Date(ctx.signedAt).getUTCFullYear(), readiness);
  const zoneOf = new Map(snap.stripRows.map((s) => [s.id, s.zone]));
  const planned = plannedItems(
    db,
    snap.stripRows.map((s) => s.id),
  );
  const venue: Draft = {
    payload: {
      ...(await payloadBase(db, ctx, readings, zoneOf, planned, turn)),
      number: venueNumber,
      kind: 'venue',
      exceptions: readiness.exceptions,
      related: { venueCertificate: null, stripCertificates: stripNumbers },
      verifyUrl: verifyUrlFor(ctx.origin, venueNumber),
    },
    readings,
    stripId: null,
  };
  const byStrip = groupBy(readings, (r) => r.stripId);
  const strips: Draft[] = [];
  for (const s of stripNumbers) {
    await turn();
    const own = byStrip.get(s.stripId) ?? [];
    strips.push({
      payload: {
        ...(await payloadBase(db, ctx, own, zoneOf, planned, turn)),
        number: s.number,
        kind: 'strip',
        exceptions: [],
        related: { venueCertificate: venueNumber, stripCertificates: [] },
        verifyUrl: verifyUrlFor(ctx.origin, s.number),
      },
      readings: own,
      stripId: s.stripId,
    });
  }
  return [venue, ...strips];
}

/** Each draft signed and rendered to PDF, in memory. */
export async function renderCertificates(
  workers: AppDeps['workers'],
  key: SigningKey,
  drafts: Draft[],
  timeZone: string,
): Promise<IssuedCertificate[]> {
  const issued: IssuedCertificate[] = [];
  for (const d of drafts) {
    const { canonical, jws } = await signCertificatePayload(key, d.payload);
    // Rendered on a worker thread: a 120-strip venue's annex is seconds of CPU.
    const rendered = await workers.run('renderCertificatePdf', { payload: d.payload, jws, keyId: key.kid, readings: d.readings, timeZone });
    const pdf = Buffer.from(rendered.buffer, rendered.byteOffset, rendered.byteLength);
    issued.push({ ...d, canonical, jws, pdf, sha256: sha256Hex(pdf) });
  }
  return issued;
}
