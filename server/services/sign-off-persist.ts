// Sign-off, step three: the rendered certificates kept. The files first, then one transaction that
// checks nothing changed while signing (same readings, same venue version) and records the
// sign-off, its certificates and the frozen venue; any failure removes the files again.
import { setImmediate } from 'node:timers/promises';
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { signOffRepository } from '../db/sign-off.repository';
import { certificatesRepository } from '../db/certificates.repository';
import { recordAudit } from '../db/audit.repository';
import { conflict } from '../lib/app-error';
import { newId } from '../lib/ids';
import { certificateFiles } from '../storage/certificate-files';
import { certifiedReadings, dismissedFaultsOf, readinessOf } from './sign-off-readiness';
import type { DismissedFault } from '../signing/certificate-record';
import type { IssuedCertificate } from './sign-off-render';
import type { ExceptionInput, VenueReadiness } from '../../shared/domain/readiness';

export interface SignOffRecord {
  user: AuthUser;
  venueId: string;
  venueVersion: number;
  signedAt: string;
  statement: string;
  exceptions: ExceptionInput[];
  readiness: VenueReadiness;
  digest: string;
  /** The venue's record as the readiness was read (sign-off.repository recordFingerprint). */
  fingerprint: string;
  /** The readings certified, in certificate order: the check that nothing changed meanwhile. */
  certifiedReadingIds: string[];
  keyId: string;
  issued: IssuedCertificate[];
  /** The dismissed faults the certificates name, and the strips they were looked up on. */
  dismissed: DismissedFault[];
  certifiedStripIds: Set<string>;
}

/** Writes the PDFs and records the sign-off; answers its id. */
export async function persistSignOff(deps: AppDeps, s: SignOffRecord): Promise<string> {
  const files = certificateFiles(deps.env.DATA_DIR);
  const written: string[] = [];
  const signOffId = newId();
  try {
    for (const c of s.issued) {
      const name = files.nameFor(c.payload.number);
      await files.writeAsync(name, c.pdf);
      written.push(name);
    }
    await setImmediate();
    deps.db.transaction((tx) => {
      const repo = signOffRepository(tx);
      // Nothing may have changed while we signed: same venue version, same readings. The record's
      // fingerprint unchanged says so in one statement; a changed one (a reading on a strip not
      // certified, say) is looked at fully: readings are never changed once written (a correction
      // is a new one), so the same certified ids in the same order are the same readings, and the
      // digest signed need not be worked out again in here.
      if (repo.recordFingerprint(s.venueId) !== s.fingerprint) {
        const again = readinessOf(tx, s.venueId, s.exceptions);
        const ids = certifiedReadings(again.snap, again.readiness).map((r) => r.readingId);
        if (!again.readiness.ready || ids.join() !== s.certifiedReadingIds.join()) {
          throw conflict('changed-meanwhile', 'Readings changed while the certificates were being made. Check the venue and sign again.');
        }
      }
      const dismissedAgain = dismissedFaultsOf(tx, s.venueId, s.certifiedStripIds)
        .map((f) => f.faultId)
        .join();
      if (dismissedAgain !== s.dismissed.map((f) => f.faultId).join()) {
        throw conflict(
          'changed-meanwhile',
          'A fault was dismissed while the certificates were being made. Check the venue and sign again.',
        );
      }
      repo.insertSignOff({
        id: signOffId,
        venueId: s.venueId,
        signedBy: s.user.id,
        signedAt: s.signedAt,
        statement: s.statement,
        exceptionsJson: JSON.stringify(s.readiness.exceptions),
        readingsDigest: s.digest,
      });
      certificatesRepository(tx).insertMany(
        s.issued.map((c) => ({
          id: newId(),
          number: c.payload.number,
          signOffId,
          venueId: s.venueId,
          stripId: c.stripId,
          kind: c.payload.kind,
          payloadJson: c.canonical,
          jws: c.jws,
          keyId: s.keyId,
          pdfSha256: c.sha256,
          pdfPath: files.nameFor(c.payload.number),
          issuedAt: s.signedAt,
        })),
      );
      if (repo.markVenueSignedOff(s.venueId, s.venueVersion) !== 1) {
        throw conflict('changed-meanwhile', 'The venue changed while the certificates were being made. Check it and sign again.');
      }
      recordAudit(tx, s.user, 'venue.signed-off', 'venue', s.venueId, {
        signOffId,
        certificates: s.issued.map((c) => c.payload.number),
        exceptions: s.readiness.exceptions.length,
        readingsDigest: s.digest,
      });
    });
  } catch (err) {
    for (const f of written) files.remove(f);
    throw err;
  }
  return signOffId;
}
