import multer from 'multer';
import { ZipArchive } from 'archiver';
import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { AppError, unprocessable } from '../lib/app-error';
import { idParams } from '../../shared/schemas/params';
import { revokeCertificateSchema } from '../../shared/schemas/sign-off';
import { certificatesService, slug } from '../services/certificates.service';

const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;
// Size, count and magic bytes are checked; the file is hashed in memory and never stored
// (OWASP ASVS 5.2.1, 5.2.2).
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 0 } });

export function certificatesRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const certificates = certificatesService(deps);

  api.get('/venues/:id/certificates', STAFF, validate(idParams, 'params'), (req, res) => {
    res.json(certificates.list(req.user!, String(req.params.id)));
  });
  api.get('/venues/:id/certificates.zip', STAFF, validate(idParams, 'params'), async (req, res) => {
    const zip = certificates.zipEntries(req.user!, String(req.params.id));
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
    await archive.finalize();
  });
  api.get('/certificates/:number/pdf', STAFF, (req, res) => {
    const file = certificates.pdf(req.user!, String(req.params.number));
    res.set({
      'Content-Type': 'application/pdf',
      // The number is [A-Z0-9-] only, so the name needs no escaping (OWASP ASVS 5.4.1).
      'Content-Disposition': `attachment; filename="${file.number}.pdf"`,
      'X-Content-Type-Options': 'nosniff',
    });
    res.send(file.data);
  });
  api.post('/certificates/:number/revoke', ['director', 'admin'], validate(revokeCertificateSchema), (req, res) => {
    res.json(certificates.revoke(req.user!, String(req.params.number), req.body.reason));
  });

  // Public: anyone holding a certificate may check it.
  api.get('/verify/:number', 'public', (req, res) => {
    res.json(certificates.verify(String(req.params.number)));
  });
  api.post('/verify/file', 'public', upload.single('file'), (req, res) => {
    const file = req.file;
    if (!file) throw unprocessable('no-file', 'Choose a PDF file to check.', { errors: [{ path: 'file', message: 'Choose a PDF file to check.' }] });
    if (!file.buffer.subarray(0, 5).equals(Buffer.from('%PDF-'))) {
      throw new AppError(415, 'not-a-pdf', 'That file is not a PDF.');
    }
    res.json(certificates.verifyFile(file.buffer));
  });
  return api;
}

/** /.well-known/jwks.json: the public keys that sign certificates (RFC 7517), for outside verifiers. */
export function wellKnownRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const certificates = certificatesService(deps);
  api.get('/.well-known/jwks.json', 'public', async (_req, res) => {
    res.set({ 'Cache-Control': 'public, max-age=300', 'Access-Control-Allow-Origin': '*' });
    res.type('application/jwk-set+json').send(JSON.stringify(await certificates.jwks()));
  });
  return api;
}
