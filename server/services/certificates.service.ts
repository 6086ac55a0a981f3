// Issued certificates: the organiser's list and downloads, revocation, and the public checks
// (by number, or by the PDF file itself). Public answers describe the one certificate asked about;
// a venue certificate's answer also says which of its strips it no longer covers (their numbers
// are in its signed record already).
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { accessService } from './access.service';
import { certificatesRepository, type CertificateRow } from '../db/certificates.repository';
import { signOffRepository } from '../db/sign-off.repository';
import { recordAudit } from '../db/audit.repository';
import { reopenIfSignedOff } from './venue-lifecycle';
import { conflict, forbidden, notFound } from '../lib/app-error';
import { sha256Hex } from '../lib/ids';
import { certificateFiles } from '../storage/certificate-files';
import { verifyUrlFor, type CertificatePayload } from '../signing/certificate-record';
import { currentSigningKey, publicJwks } from '../signing/signing-keys';
import { isCertificateNumber, normaliseCertificateNumber } from '../../shared/domain/certificate-number';
import { bindScope } from './bind';
import { incidentsRepository } from '../db/incidents.repository';

function scopeOf(deps: AppDeps) {
  const access = accessService(deps.db);
  const repo = certificatesRepository(deps.db);
  const files = certificateFiles(deps.env.DATA_DIR);
  return { deps, access, repo, files };
}
type Scope = ReturnType<typeof scopeOf>;

/** The strips a venue certificate no longer covers: their strip certificates were revoked. */
function notCovering({ repo }: Scope, c: CertificateRow, p: CertificatePayload) {
  if (c.kind !== 'venue') return [];
  const revoked = new Map(
    repo
      .ofSignOff(c.signOffId)
      .filter((x) => x.certificate.kind === 'strip' && x.certificate.status === 'revoked')
      .map((x) => [x.certificate.number, x.certificate]),
  );
  // Labels as certified (the strip may have been renamed since).
  return p.related.stripCertificates.flatMap((s) => {
    const r = revoked.get(s.number);
    return r ? [{ strip: s.label, number: s.number, revokedAt: r.revokedAt, revokedReason: r.revokedReason }] : [];
  });
}

/** A venue certificate's amendments, and (while it stands) its strips out of service now. */
function competitionDays({ deps }: Scope, c: CertificateRow) {
  if (c.kind !== 'venue') return { amendments: [], outOfService: [] };
  const incidents = incidentsRepository(deps.db);
  return {
    amendments: incidents.amendedCertificates(c.signOffId),
    outOfService:
      c.status === 'valid' ? incidents.outOfService(c.venueId).map((s) => ({ stripId: s.stripId, strip: s.strip, since: s.since! })) : [],
  };
}

function publicView(scope: Scope, c: CertificateRow) {
  const { deps } = scope;
  const p = JSON.parse(c.payloadJson) as CertificatePayload;
  return {
    status: c.status,
    number: c.number,
    kind: c.kind,
    event: p.event.name,
    eventDates: { startsOn: p.event.startsOn, endsOn: p.event.endsOn },
    venue: p.venue.name,
    strips: p.strips.map((s) => s.label),
    notCovering: notCovering(scope, c, p),
    organisation: p.issuer.organisation.name,
    issuedAt: c.issuedAt,
    signedBy: p.signer.name,
    signedAt: p.signedAt,
    profile: { name: p.profile.name, version: p.profile.version },
    items: p.items.length,
    readings: p.readings.count,
    supersededAt: c.supersededAt,
    supersededPendingSince: c.supersededPendingSince,
    successorNumber: c.successorId ? (scope.repo.byId(c.successorId)?.number ?? null) : null,
    ...competitionDays(scope, c),
    revokedAt: c.revokedAt,
    revokedReason: c.revokedReason,
    keyId: c.keyId,
    jws: c.jws,
    pdfSha256: c.pdfSha256,
    verifyUrl: verifyUrlFor(deps.env.APP_ORIGIN, c.number),
  };
}

/** A certificate the user may see (same organisation, read access to its venue), else 404/403. */
function readable({ access, repo }: Scope, user: AuthUser, number: string) {
  const c = repo.byNumber(normaliseCertificateNumber(number));
  if (!c) throw notFound('That certificate');
  const row = access.requireVenue(user, c.venueId, 'read');
  return { c, row };
}

function latestSet({ repo }: Scope, venueId: string) {
  const all = repo.ofVenue(venueId);
  const latest = all[0]?.certificate.signOffId;
  return all.filter((x) => x.certificate.signOffId === latest);
}

function list({ deps, access, repo }: Scope, user: AuthUser, venueId: string) {
  const row = access.requireVenue(user, venueId, 'read');
  const canRevoke = user.role === 'admin' || (user.role === 'director' && row.event.directorId === user.id);
  const list = repo.ofVenue(venueId).map(({ certificate: c, signOff, signerName, stripLabel }) => ({
    number: c.number,
    kind: c.kind,
    stripId: c.stripId,
    stripLabel,
    status: c.status,
    issuedAt: c.issuedAt,
    signOffId: c.signOffId,
    signedBy: signerName,
    signedAt: signOff.signedAt,
    supersededAt: c.supersededAt,
    revokedAt: c.revokedAt,
    revokedReason: c.revokedReason,
    supersededPendingSince: c.supersededPendingSince,
    successorNumber: c.successorId ? (repo.byId(c.successorId)?.number ?? null) : null,
    pdfSha256: c.pdfSha256,
    verifyUrl: verifyUrlFor(deps.env.APP_ORIGIN, c.number),
  }));
  // Newest sign-off first; within one, the venue certificate, then strips in venue order.
  const order = new Map<string, number>();
  list.forEach((c) => order.set(c.signOffId, order.get(c.signOffId) ?? order.size));
  list.sort((a, b) => order.get(a.signOffId)! - order.get(b.signOffId)! || (a.kind === b.kind ? 0 : a.kind === 'venue' ? -1 : 1));
  return {
    venue: { id: row.venue.id, name: row.venue.name, status: row.venue.status },
    event: { id: row.event.id, name: row.event.name, startsOn: row.event.startsOn, endsOn: row.event.endsOn },
    canRevoke,
    certificates: list,
  };
}

function pdf(scope: Scope, user: AuthUser, number: string) {
  const { files } = scope;
  const { c } = readable(scope, user, number);
  if (!c.pdfPath) throw notFound('That certificate file');
  return { number: c.number, data: files.read(c.pdfPath) };
}

/** The latest sign-off's certificates of a venue, for the ZIP. */
function zipEntries(scope: Scope, user: AuthUser, venueId: string) {
  const { access, files } = scope;
  const row = access.requireVenue(user, venueId, 'read');
  // An amended strip's old certificate is left out: its successor is in the same set.
  const set = latestSet(scope, venueId).filter((x) => x.certificate.pdfPath && !x.certificate.successorId);
  if (set.length === 0) throw notFound('A certificate of this venue');
  const ordered = [...set].sort((a, b) => (a.certificate.kind === b.certificate.kind ? 0 : a.certificate.kind === 'venue' ? -1 : 1));
  return {
    venueName: row.venue.name,
    signedAt: set[0].signOff.signedAt,
    entries: ordered.map(({ certificate: c, stripLabel }) => ({
      name: `${c.kind === 'venue' ? 'venue' : slug(stripLabel ?? 'strip')}-${c.number}.pdf`,
      data: files.read(c.pdfPath!),
      date: new Date(c.issuedAt),
    })),
  };
}

/**
 * Revokes a certificate. A venue certificate takes its strip certificates with it and, when it
 * is the venue's current sign-off, re-opens the venue (a new sign-off issues new ones). A strip
 * certificate alone leaves the venue certificate standing, which then says it no longer covers
 * that strip.
 */
function revoke(scope: Scope, user: AuthUser, number: string, reason: string) {
  const { deps, repo } = scope;
  const { c, row } = readable(scope, user, number);
  if (!(user.role === 'admin' || (user.role === 'director' && row.event.directorId === user.id))) {
    throw forbidden('Only the technical director of this event or an admin can revoke its certificates.');
  }
  if (c.status === 'revoked') throw conflict('already-revoked', 'This certificate is already revoked.');
  const at = new Date().toISOString();
  deps.db.transaction((tx) => {
    const txRepo = certificatesRepository(tx);
    const revokeOne = (cert: CertificateRow, why: string, extra: Record<string, unknown> = {}) => {
      txRepo.revoke(cert.id, { at, reason: why, by: user.id });
      recordAudit(tx, user, 'certificate.revoked', 'certificate', cert.id, {
        number: cert.number,
        reason: why,
        previousStatus: cert.status,
        ...extra,
      });
    };
    revokeOne(c, reason);
    if (c.kind !== 'venue') return;
    const strips = txRepo.ofSignOff(c.signOffId).filter((x) => x.certificate.kind === 'strip' && x.certificate.status !== 'revoked');
    for (const s of strips)
      revokeOne(s.certificate, `The venue certificate ${c.number} was revoked: ${reason}`, { withVenueCertificate: c.number });
    if (signOffRepository(tx).activeSignOff(c.venueId)?.id === c.signOffId) {
      reopenIfSignedOff(tx, {
        venueId: c.venueId,
        orgId: user.orgId,
        actorId: user.id,
        reason: `Venue certificate ${c.number} revoked: ${reason}`,
      });
    }
  });
  return publicView(scope, repo.byNumber(c.number)!);
}

function verify(scope: Scope, number: string) {
  const { repo } = scope;
  const n = normaliseCertificateNumber(number);
  const c = isCertificateNumber(n) ? repo.byNumber(n) : undefined;
  if (!c) throw notFound('A certificate with that number');
  return publicView(scope, c);
}

/** Byte for byte: the SHA-256 of the upload against the hashes of the issued files. */
function verifyFile(scope: Scope, data: Buffer) {
  const { repo } = scope;
  const sha256 = sha256Hex(data);
  const found = repo.bySha(sha256);
  if (found.length === 0) return { match: false as const, sha256 };
  return { match: true as const, sha256, certificate: publicView(scope, found[0]) };
}

/** Made on first start if there is no key yet, so the set is never empty. */
async function jwks({ deps }: Scope) {
  await currentSigningKey(deps.db, deps.env);
  return publicJwks(deps.db);
}

export function certificatesService(deps: AppDeps) {
  return bindScope(scopeOf(deps), { list, pdf, zipEntries, revoke, verify, verifyFile, jwks });
}

export function slug(text: string): string {
  return (
    text
      .normalize('NFKD')
      .replace(/[^\w\s-]/g, '')
      .trim()
      .toLowerCase()
      .replace(/[\s_-]+/g, '-')
      .slice(0, 60) || 'file'
  );
}
export type CertificatesService = ReturnType<typeof certificatesService>;
