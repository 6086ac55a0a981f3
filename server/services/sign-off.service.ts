// Signing a venue off: readiness from the latest readings, the director's password re-checked,
// certificates signed (Ed25519 JWS) and rendered to PDF, then one transaction records it all and
// freezes the venue. The organiser and the director get an e-mail with the links.
import type { AppDeps } from '../deps';
import type { Db, Tx } from '../db/client';
import type { AuthUser } from '../auth/types';
import { verifyPassword } from '../auth/password';
import { accessService } from './access.service';
import { venuesRepository } from '../db/venues.repository';
import { signOffRepository } from '../db/sign-off.repository';
import { faultsRepository } from '../db/faults.repository';
import { leadNullsRepository } from '../db/lead-nulls.repository';
import { writeAudit } from '../db/audit.repository';
import { AppError, conflict, unprocessable } from '../lib/app-error';
import { newId } from '../lib/ids';
import { currentSigningKey, signCertificatePayload } from '../signing/signing-keys';
import {
  CERTIFICATE_FORMAT,
  SCOPE_SENTENCE,
  newCertificateNumber,
  readingsDigest,
  verifyUrlFor,
  type CertificatePayload,
  type CertifiedLeadNull,
  type CertifiedReading,
  type DismissedFault,
} from '../signing/certificate-record';
import { certificateFiles } from '../storage/certificate-files';
import { sha256Hex } from '../lib/ids';
import {
  describeIssue,
  venueReadiness,
  type ExceptionInput,
  type ReadinessStripInput,
  type VenueReadiness,
} from '../../shared/domain/readiness';
import type { LimitRule } from '../../shared/domain/limits';
import { formatOhm } from '../../shared/domain/units';
import type { SignOffInput } from '../../shared/schemas/sign-off';

const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

export const DEFAULT_STATEMENT =
  'I have reviewed the readings listed in this certificate and sign the venue off for competition.';

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

/** What the database says now: readiness input, and the readings that would be certified. */
function snapshot(db: Db | Tx, venueId: string) {
  const repo = signOffRepository(db);
  const stripRows = venuesRepository(db).stripsOf(venueId);
  const stepRows = repo.stepsWithLatestReading(venueId);
  const faultRows = repo.openFaultsOf(venueId);
  const inputs: ReadinessStripInput[] = stripRows.map((s) => ({
    stripId: s.id,
    label: s.label,
    withdrawn: !!s.withdrawnAt,
    withdrawnReason: s.withdrawnReason,
    steps: stepRows
      .filter((r) => r.stripId === s.id)
      .map((r) => ({
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
    openFaults: faultRows
      .filter((f) => f.stripId === s.id)
      .map((f) => ({ faultId: f.faultId, positionName: f.positionName, kind: f.kind, conductors: f.conductors, status: f.status })),
  }));
  return { stripRows, stepRows, inputs };
}

function certifiedReadings(snap: ReturnType<typeof snapshot>, readiness: VenueReadiness): CertifiedReading[] {
  const ready = new Set(readiness.strips.filter((s) => s.state === 'ready').map((s) => s.stripId));
  const labels = new Map(snap.stripRows.map((s) => [s.id, s.label]));
  return snap.stepRows
    .filter((r) => ready.has(r.stripId) && r.required && r.reading)
    .map((r) => {
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
    });
}

/** The faults of the venue its director dismissed as typing mistakes, on the given strips. */
function dismissedFaultsOf(db: Db | Tx, venueId: string, stripIds: Set<string>): DismissedFault[] {
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

/** The test-lead nulls the readings used, each with who measured it, when and how many readings used it. */
function leadNullsOf(db: Db | Tx, list: CertifiedReading[]): CertifiedLeadNull[] {
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

function issuesProblem(readiness: VenueReadiness) {
  return {
    issues: readiness.issues.map((i) => ({ ...i, message: describeIssue(i) })),
    strips: readiness.strips
      .filter((s) => s.state !== 'ready' && s.state !== 'withdrawn' && s.state !== 'exception')
      .map((s) => ({ stripId: s.stripId, label: s.label, state: s.state, missing: s.missing, failing: s.failing, openFaults: s.openFaults })),
  };
}

export function signOffService(deps: AppDeps) {
  const access = accessService(deps.db);
  const repo = signOffRepository(deps.db);
  const files = certificateFiles(deps.env.DATA_DIR);

  function readinessOf(venueId: string, exceptions: ExceptionInput[] = []) {
    const snap = snapshot(deps.db, venueId);
    return { snap, readiness: venueReadiness(snap.inputs, exceptions) };
  }

  async function notify(v: {
    orgId: string;
    venueId: string;
    venueName: string;
    eventName: string;
    signerName: string;
    recipients: (string | null)[];
    numbers: { number: string; kind: 'venue' | 'strip'; label: string }[];
  }) {
    const people = repo.usersByIds([...new Set(v.recipients.filter((x): x is string => !!x))]);
    const origin = deps.env.APP_ORIGIN;
    const list = v.numbers
      .map((n) => `  ${n.kind === 'venue' ? 'Venue' : n.label}: ${n.number}\n  ${verifyUrlFor(origin, n.number)}`)
      .join('\n\n');
    for (const person of people) {
      const text =
        `Hello ${person.name},\n\n` +
        `${v.signerName} has signed off ${v.venueName} for ${v.eventName}. The signed certificates are ready.\n\n` +
        `Download them (one PDF each, or all as a ZIP):\n${origin}/venues/${v.venueId}/certificates\n\n` +
        `Anyone can check a certificate, without signing in, on its verification page:\n\n${list}\n\n` +
        `The certificates cover the competition equipment tested, not the building's electrical installation.\n`;
      try {
        await deps.mailer.send({ orgId: v.orgId, to: person.email, subject: `Signed off: ${v.venueName}, ${v.eventName}`, text });
      } catch (err) {
        // The sign-off stands; the certificates page has everything the e-mail links to.
        deps.log.error(`sign-off e-mail to ${person.email} failed`, err);
      }
    }
  }

  return {
    readiness(user: AuthUser, venueId: string) {
      const row = access.requireVenue(user, venueId, 'read');
      const { readiness } = readinessOf(venueId);
      const active = row.venue.status === 'signed-off' ? repo.activeSignOff(venueId) : undefined;
      return {
        venue: { id: row.venue.id, name: row.venue.name, status: row.venue.status },
        event: { id: row.event.id, name: row.event.name, startsOn: row.event.startsOn, endsOn: row.event.endsOn },
        canSignOff: user.role === 'director' && row.event.directorId === user.id,
        signedOff: active ? { signOffId: active.id, signedAt: active.signedAt } : null,
        ...readiness,
        issues: readiness.issues.map((i) => ({ ...i, message: describeIssue(i) })),
      };
    },

    async signOff(user: AuthUser, venueId: string, input: SignOffInput) {
      const row = access.requireVenue(user, venueId, 'sign-off');
      const me = repo.user(user.id);
      // Re-entering the password confirms that the person at the screen is the director.
      if (!me?.passwordHash || !(await verifyPassword(input.password, me.passwordHash))) {
        throw new AppError(401, 'wrong-password', 'That password is not right. Nothing was signed.');
      }
      if (row.venue.status === 'signed-off') {
        throw conflict('already-signed-off', 'This venue is already signed off. A new reading or repair re-opens it.');
      }
      const exceptions = input.exceptions ?? [];
      const { snap, readiness } = readinessOf(venueId, exceptions);
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

      // The event loop gets a turn between the long synchronous steps of a large venue, so
      // readings arriving meanwhile wait for one step, not for all of them.
      await yieldToEventLoop();
      const readings = certifiedReadings(snap, readiness);
      const digest = readingsDigest(readings);
      const certifiedStripIds = new Set(readiness.strips.filter((s) => s.state === 'ready').map((s) => s.stripId));
      const dismissed = dismissedFaultsOf(deps.db, venueId, certifiedStripIds);
      const profile = repo.profile(row.venue.profileId)!;
      const org = repo.organisation(row.event.orgId)!;
      const rules = JSON.parse(profile.rulesJson) as LimitRule[];
      const key = await currentSigningKey(deps.db, deps.env);
      const signedAt = new Date().toISOString();
      const year = new Date(signedAt).getUTCFullYear();
      const statement = input.statement?.trim() || DEFAULT_STATEMENT;
      const origin = deps.env.APP_ORIGIN;

      const fresh = (kind: 'venue' | 'strip', taken: Set<string>) => {
        for (;;) {
          const n = newCertificateNumber(kind, year);
          if (!taken.has(n) && !repo.numberTaken(n)) {
            taken.add(n);
            return n;
          }
        }
      };
      const taken = new Set<string>();
      const venueNumber = fresh('venue', taken);
      const certifiedStrips = readiness.strips.filter((s) => s.state === 'ready');
      const stripNumbers = certifiedStrips.map((s) => ({ stripId: s.stripId, label: s.label, number: fresh('strip', taken) }));
      const zoneOf = new Map(snap.stripRows.map((s) => [s.id, s.zone]));

      const base = (list: CertifiedReading[]): Omit<CertificatePayload, 'number' | 'kind' | 'exceptions' | 'related' | 'verifyUrl'> => {
        const testers = new Map(list.map((r) => [r.takenById, r.takenBy]));
        const times = list.map((r) => r.takenAt).sort();
        const strips = [...new Set(list.map((r) => r.stripId))].map((stripId) => {
          const own = list.filter((r) => r.stripId === stripId);
          const items = new Map<string, { position: string; kind: string; assetTag: string | null }>();
          for (const r of own) items.set(`${r.position}|${r.assetTag}`, { position: r.position, kind: r.equipmentKind, assetTag: r.assetTag });
          return {
            id: stripId,
            label: own[0].stripLabel,
            zone: zoneOf.get(stripId) ?? null,
            items: [...items.values()],
            readings: own.length,
            nearLimit: own.filter((r) => r.verdict === 'near-limit').length,
          };
        });
        return {
          format: CERTIFICATE_FORMAT,
          issuer: { name: 'Stripwarden' as const, origin, organisation: { id: org.id, name: org.name } },
          event: { id: row.event.id, name: row.event.name, startsOn: row.event.startsOn, endsOn: row.event.endsOn },
          venue: { id: row.venue.id, name: row.venue.name },
          strips,
          items: [...new Set(list.map((r) => r.assetTag).filter((t): t is string => !!t))].sort(),
          readings: {
            count: list.length,
            nearLimit: list.filter((r) => r.verdict === 'near-limit').length,
            digestAlg: 'SHA-256' as const,
            digest: readingsDigest(list),
          },
          profile: {
            id: profile.id,
            name: profile.name,
            version: profile.version,
            rules: rules.map((r) => ({ id: r.id, source: r.source, limit: ruleLimitText(r), note: r.note ?? null })),
          },
          testedBy: [...testers].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name)),
          leadNulls: leadNullsOf(deps.db, list),
          dismissedFaults: dismissed.filter((f) => strips.some((s) => s.id === f.stripId)),
          testedFrom: times[0],
          testedTo: times[times.length - 1],
          signer: { id: user.id, name: me.name, role: 'Technical director' as const },
          signedAt,
          statement,
          scope: SCOPE_SENTENCE,
        };
      };

      const drafts: { payload: CertificatePayload; readings: CertifiedReading[]; stripId: string | null }[] = [
        {
          payload: {
            ...base(readings),
            number: venueNumber,
            kind: 'venue',
            exceptions: readiness.exceptions,
            related: { venueCertificate: null, stripCertificates: stripNumbers },
            verifyUrl: verifyUrlFor(origin, venueNumber),
          },
          readings,
          stripId: null,
        },
        ...stripNumbers.map((s) => {
          const own = readings.filter((r) => r.stripId === s.stripId);
          return {
            payload: {
              ...base(own),
              number: s.number,
              kind: 'strip' as const,
              exceptions: [],
              related: { venueCertificate: venueNumber, stripCertificates: [] },
              verifyUrl: verifyUrlFor(origin, s.number),
            },
            readings: own,
            stripId: s.stripId,
          };
        }),
      ];

      // Sign and render everything first; only then write, so a failure leaves nothing behind.
      const issued: ((typeof drafts)[number] & { canonical: string; jws: string; pdf: Buffer; sha256: string; fileName: string })[] = [];
      for (const d of drafts) {
        const { canonical, jws } = await signCertificatePayload(key, d.payload);
        // Rendered on a worker thread: a 120-strip venue's annex is seconds of CPU.
        const rendered = await deps.workers.run('renderCertificatePdf', { payload: d.payload, jws, keyId: key.kid, readings: d.readings });
        const pdf = Buffer.from(rendered.buffer, rendered.byteOffset, rendered.byteLength);
        issued.push({ ...d, canonical, jws, pdf, sha256: sha256Hex(pdf), fileName: files.nameFor(d.payload.number) });
      }
      const written: string[] = [];
      const signOffId = newId();
      try {
        for (const c of issued) {
          await files.writeAsync(c.fileName, c.pdf);
          written.push(c.fileName);
        }
        await yieldToEventLoop();
        deps.db.transaction((tx) => {
          const txRepo = signOffRepository(tx);
          // Nothing may have changed while we signed: same venue version, same readings.
          const again = snapshot(tx, venueId);
          const againReadiness = venueReadiness(again.inputs, exceptions);
          if (!againReadiness.ready || readingsDigest(certifiedReadings(again, againReadiness)) !== digest) {
            throw conflict('changed-meanwhile', 'Readings changed while the certificates were being made. Check the venue and sign again.');
          }
          const dismissedAgain = dismissedFaultsOf(tx, venueId, certifiedStripIds).map((f) => f.faultId).join();
          if (dismissedAgain !== dismissed.map((f) => f.faultId).join()) {
            throw conflict('changed-meanwhile', 'A fault was dismissed while the certificates were being made. Check the venue and sign again.');
          }
          txRepo.insertSignOff({
            id: signOffId,
            venueId,
            signedBy: user.id,
            signedAt,
            statement,
            exceptionsJson: JSON.stringify(readiness.exceptions),
            readingsDigest: digest,
          });
          for (const c of issued) {
            txRepo.insertCertificate({
              id: newId(),
              number: c.payload.number,
              signOffId,
              venueId,
              stripId: c.stripId,
              kind: c.payload.kind,
              payloadJson: c.canonical,
              jws: c.jws,
              keyId: key.kid,
              pdfSha256: c.sha256,
              pdfPath: c.fileName,
              issuedAt: signedAt,
            });
          }
          if (txRepo.markVenueSignedOff(venueId, row.venue.version) !== 1) {
            throw conflict('changed-meanwhile', 'The venue changed while the certificates were being made. Check it and sign again.');
          }
          writeAudit(tx, {
            orgId: user.orgId,
            actorId: user.id,
            action: 'venue.signed-off',
            entityType: 'venue',
            entityId: venueId,
            detail: { signOffId, certificates: issued.map((c) => c.payload.number), exceptions: readiness.exceptions.length, readingsDigest: digest },
          });
        });
      } catch (err) {
        for (const f of written) files.remove(f);
        throw err;
      }

      await notify({
        orgId: row.event.orgId,
        venueId,
        venueName: row.venue.name,
        eventName: row.event.name,
        signerName: me.name,
        recipients: [row.event.organiserId, row.event.directorId],
        numbers: issued.map((c) => ({
          number: c.payload.number,
          kind: c.payload.kind,
          label: c.payload.kind === 'venue' ? row.venue.name : c.payload.strips[0].label,
        })),
      });

      return {
        signOffId,
        signedAt,
        certificates: issued.map((c) => ({
          number: c.payload.number,
          kind: c.payload.kind,
          ...(c.stripId ? { stripId: c.stripId } : {}),
          status: 'valid' as const,
          pdfSha256: c.sha256,
          verifyUrl: c.payload.verifyUrl,
        })),
      };
    },
  };
}
export type SignOffService = ReturnType<typeof signOffService>;
