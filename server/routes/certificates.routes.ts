import multer from 'multer';
import { ZipArchive } from 'archiver';
import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { AppError, unprocessable } from '../lib/app-error';
import { certificatesContracts as c } from '../../shared/contracts/certificates';
import { certificatesService, slug } from '../services/certificates.service';
import { incidentReport } from '../services/incident-report.service';

const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;
// Size, count and magic bytes are checked; the file is hashed in memory and never stored
// (OWASP ASVS 5.2.1, 5.2.2).
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 0 } });

export function certificatesRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const certificates = certificatesService(deps);

  api.route(c.ofVenue, ({ user, params }) => certificates.list(user, params.id));
  api.route(c.zip, async ({ user, params, res }) => {
    const zip = certificates.zipEntries(user, params.id);
    const name = `certificates-${slug(zip.venueName)}-${zip.signedAt.slice(0, 10)}.zip`;
    res.set({
      'Content-Type': 'application/zip',
      'Content-Disposition': `attachment; filename="${name}"`,
      'X-Content-Type-Options': 'nosniff',
    });
    const archive = new ZipArchive({ zlib: { level: 6 } });
    archive.on('error', (err: Error) => res.destroy(err));
    archive.pipe(res);
    for (const e of zip.entries) archive.append(e.data, { name: e.name, date: e.date });
    // The record of the competition days goes with the certificates once there is one.
    const report = await incidentReport(deps, user, params.id);
    if (report.count > 0) archive.append(report.pdf, { name: `incidents-${slug(zip.venueName)}.pdf` });
    await archive.finalize();
  });
  api.route(c.pdf, ({ user, params, res }) => {
    const pdf = certificates.pdf(user, params.number);
    res.set({
      'Content-Type': 'application/pdf',
      // The number is [A-Z0-9-] only, so the name needs no escaping (OWASP ASVS 5.4.1).
      'Content-Disposition': `attachment; filename="${pdf.number}.pdf"`,
      'X-Content-Type-Options': 'nosniff',
    });
    res.send(pdf.data);
  });
  api.route(c.revoke, ({ user, params, body }) => certificates.revoke(user, params.number, body.reason));
  api.route(c.verify, ({ params }) => certificates.verify(params.number));
  api.route(
    c.verifyFile,
    ({ req }) => {
      const pdf = req.file;
      if (!pdf)
        throw unprocessable('no-file', 'Choose a PDF file to check.', {
          errors: [{ path: 'file', message: 'Choose a PDF file to check.' }],
        });
      if (!pdf.buffer.subarray(0, 5).equals(Buffer.from('%PDF-'))) {
        throw new AppError(415, 'not-a-pdf', 'That file is not a PDF.');
      }
      return certificates.verifyFile(pdf.buffer);
    },
    { before: [upload.single('file')] },
  );
  return api;
}

/** /.well-known/jwks.json: the public keys that sign certificates (RFC 7517), for outside verifiers. */
export function wellKnownRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const certificates = certificatesService(deps);
  api.route(c.jwks, async ({ res }) => {
    res.set({ 'Cache-Control': 'public, max-age=300', 'Access-Control-Allow-Origin': '*' }).type('application/jwk-set+json');
    return certificates.jwks();
  });
  return api;
}
