// The director amends a signed-off venue after incidents: a new signed strip certificate for each
// strip whose incidents are resolved; the old strip certificate is superseded by it; the venue
// certificate and the sign-off stay as they are. Signed and rendered in memory first, then the
// files, then one transaction (as for sign-off: a failure leaves nothing behind).
import type { AppDeps } from '../deps';
import { DEFAULT_TIME_ZONE } from '../../shared/format/date-time';
import type { AuthUser } from '../auth/types';
import { verifyPassword } from '../auth/password';
import { accessService } from './access.service';
import { signOffRepository } from '../db/sign-off.repository';
import { certificatesRepository } from '../db/certificates.repository';
import { incidentsRepository, type IncidentListRow } from '../db/incidents.repository';
import { planRepository } from '../db/plan.repository';
import { recordAudit } from '../db/audit.repository';
import { AppError, conflict, unprocessable } from '../lib/app-error';
import { newId } from '../lib/ids';
import { currentSigningKey } from '../signing/signing-keys';
import { certificateFiles } from '../storage/certificate-files';
import { certifiedReadings, dismissedFaultsOf, readinessOf } from './sign-off-readiness';
import { draftCertificates, renderCertificates, type IssuedCertificate, type SigningContext } from './sign-off-render';
import type { VenueReadiness } from '../../shared/domain/readiness';
import type { AmendmentInput } from '../../shared/schemas/incidents';
import type { Db } from '../db/client';

export const AMENDMENT_STATEMENT = 'I have reviewed the retest of this strip after its incidents and return it to competition.';

/** The named incidents, each of this venue, resolved and not amended yet; answers their strips. */
function requireAmendable(db: Db, venueId: string, ids: string[]) {
  const rows = incidentsRepository(db).ofIds(ids);
  const byId = new Map(rows.map((r) => [r.incident.id, r]));
  ids.forEach((id, k) => {
    const r = byId.get(id);
    if (!r || r.incident.venueId !== venueId) {
      throw unprocessable('unknown-incident', 'An incident named is not of this venue.', {
        errors: [{ path: `incidentIds.${k}`, message: 'Not an incident of this venue.' }],
      });
    }
    if (r.incident.status !== 'resolved')
      throw conflict('incident-open', `The incident on ${r.stripLabel} is not resolved yet.`, { incidentId: id });
    if (r.incident.amendmentId)
      throw conflict('already-amended', `The incident on ${r.stripLabel} was amended already.`, { incidentId: id });
  });
  const stripIds = [...new Set(rows.map((r) => r.incident.stripId))];
  for (const s of stripIds) {
    const open = incidentsRepository(db).openOfStrip(s);
    if (open.length > 0)
      throw conflict('incident-open', `${rows.find((r) => r.incident.stripId === s)!.stripLabel} has an incident still open.`);
  }
  return { rows, stripIds };
}

/** Readiness with only the amended strips counted as ready; each of them must be. */
function amendedReadiness(db: Db, venueId: string, stripIds: string[]) {
  const { snap, readiness } = readinessOf(db, venueId);
  const amended = new Set(stripIds);
  const notReady = readiness.strips.filter((s) => amended.has(s.stripId) && s.state !== 'ready');
  if (notReady.length > 0) {
    throw conflict('not-ready', `${notReady.map((s) => s.label).join(', ')} is not ready: some readings are missing or failing.`, {
      strips: notReady.map((s) => ({
        stripId: s.stripId,
        label: s.label,
        state: s.state,
        missing: s.missing,
        failing: s.failing,
        openFaults: s.openFaults,
      })),
    });
  }
  const only: VenueReadiness = {
    ...readiness,
    strips: readiness.strips.map((s) => (amended.has(s.stripId) ? s : { ...s, state: 'missing' as const })),
  };
  return { snap, readiness: only };
}

async function sign(
  deps: AppDeps,
  user: AuthUser,
  ctxBase: Omit<SigningContext, 'dismissed'>,
  venueId: string,
  stripIds: string[],
  venueNumber: string,
) {
  const { snap, readiness } = amendedReadiness(deps.db, venueId, stripIds);
  const readings = certifiedReadings(snap, readiness);
  const ctx: SigningContext = { ...ctxBase, dismissed: dismissedFaultsOf(deps.db, venueId, new Set(stripIds)) };
  const drafts = (await draftCertificates(deps.db, ctx, snap, readiness, readings))
    .filter((d) => d.payload.kind === 'strip')
    .map((d) => ({ ...d, payload: { ...d.payload, related: { venueCertificate: venueNumber, stripCertificates: [] } } }));
  const timeZone = certificatesRepository(deps.db).venueTimeZone(venueId) ?? DEFAULT_TIME_ZONE;
  return renderCertificates(deps.workers, await currentSigningKey(deps.db, deps.env), drafts, timeZone);
}

function persist(
  deps: AppDeps,
  user: AuthUser,
  v: { venueId: string; signOffId: string; at: string; rows: IncidentListRow[]; issued: IssuedCertificate[]; keyId: string },
) {
  const amendmentId = newId();
  deps.db.transaction((tx) => {
    const certs = certificatesRepository(tx);
    const incidents = incidentsRepository(tx);
    // Nothing may have been amended or re-opened meanwhile.
    if (signOffRepository(tx).activeSignOff(v.venueId)?.id !== v.signOffId)
      throw conflict('changed-meanwhile', 'The venue was re-opened meanwhile; sign it off again.');
    if (incidents.ofIds(v.rows.map((r) => r.incident.id)).some((r) => r.incident.amendmentId || r.incident.status !== 'resolved')) {
      throw conflict('changed-meanwhile', 'These incidents changed meanwhile; reload and amend again.');
    }
    incidents.insertAmendment({ id: amendmentId, venueId: v.venueId, signOffId: v.signOffId, amendedBy: user.id, amendedAt: v.at });
    const files = certificateFiles(deps.env.DATA_DIR);
    for (const c of v.issued) {
      const id = newId();
      const previous = certs.validStripCertificate(c.stripId!);
      certs.insert({
        id,
        number: c.payload.number,
        signOffId: v.signOffId,
        venueId: v.venueId,
        stripId: c.stripId,
        kind: 'strip',
        payloadJson: c.canonical,
        jws: c.jws,
        keyId: v.keyId,
        pdfSha256: c.sha256,
        pdfPath: files.nameFor(c.payload.number),
        issuedAt: v.at,
        amendmentId,
      });
      if (previous) certs.supersede(previous.id, { at: v.at, successorId: id });
      planRepository(tx).updateStrip(c.stripId!, { outOfServiceSince: null });
    }
    for (const r of v.rows) incidents.update(r.incident.id, { amendmentId });
    recordAudit(tx, user, 'venue.amended', 'venue', v.venueId, {
      amendmentId,
      incidents: v.rows.map((r) => r.incident.id),
      certificates: v.issued.map((c) => c.payload.number),
    });
  });
  return amendmentId;
}

async function amend(deps: AppDeps, user: AuthUser, venueId: string, input: AmendmentInput) {
  const repo = signOffRepository(deps.db);
  const row = accessService(deps.db).requireVenue(user, venueId, 'sign-off');
  const me = repo.user(user.id);
  if (!me?.passwordHash || !(await verifyPassword(input.password, me.passwordHash))) {
    throw new AppError(401, 'wrong-password', 'That password is not right. Nothing was amended.');
  }
  const active = repo.activeSignOff(venueId);
  if (row.venue.status !== 'signed-off' || !active)
    throw conflict('not-signed-off', 'Only a signed-off venue is amended; sign the venue off instead.');
  const venueCert = certificatesRepository(deps.db)
    .ofSignOff(active.id)
    .find((c) => c.certificate.kind === 'venue');
  if (!venueCert || venueCert.certificate.status !== 'valid')
    throw conflict('venue-certificate-not-valid', 'The venue certificate is not valid; sign the venue off again.');
  const { rows, stripIds } = requireAmendable(deps.db, venueId, input.incidentIds);
  const org = repo.organisation(row.event.orgId)!;
  const at = new Date().toISOString();
  const base = {
    row,
    signer: { ...user, displayName: me.name },
    organisation: { id: org.id, name: org.name },
    profile: repo.profile(row.venue.profileId)!,
    signedAt: at,
    statement: AMENDMENT_STATEMENT,
    origin: deps.env.APP_ORIGIN,
  };
  const issued = await sign(deps, user, base, venueId, stripIds, venueCert.certificate.number);
  const files = certificateFiles(deps.env.DATA_DIR);
  const written: string[] = [];
  let amendmentId: string;
  try {
    for (const c of issued) {
      const name = files.nameFor(c.payload.number);
      await files.writeAsync(name, c.pdf);
      written.push(name);
    }
    amendmentId = persist(deps, user, {
      venueId,
      signOffId: active.id,
      at,
      rows,
      issued,
      keyId: (await currentSigningKey(deps.db, deps.env)).kid,
    });
  } catch (err) {
    for (const f of written) files.remove(f);
    throw err;
  }
  const certs = certificatesRepository(deps.db);
  return {
    amendmentId,
    amendedAt: at,
    certificates: issued.map((c) => ({
      number: c.payload.number,
      kind: 'strip' as const,
      stripId: c.stripId!,
      status: 'valid' as const,
      supersedes: certs.predecessorOf(c.payload.number)?.number ?? null,
      pdfSha256: c.sha256,
      verifyUrl: c.payload.verifyUrl,
    })),
  };
}

export function amendmentsService(deps: AppDeps) {
  return { amend: (user: AuthUser, venueId: string, input: AmendmentInput) => amend(deps, user, venueId, input) };
}
