import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { singleFileUpload, uploadedFile } from '../http/upload';
import { idParams } from '../../shared/schemas/params';
import { ATTACHMENT_ABSOLUTE_MAX_BYTES, type AttachmentOwnerType } from '../../shared/schemas/attachments';
import { attachmentsService, uploadCapFor } from '../services/attachments.service';
import { TESTERS } from './readings.routes';

const MANAGE = ['admin', 'director'] as const;

// Uploads: faults and repairs by those who may test the venue, register items by those who keep
// the register. Reading: whoever may see the owner. There is no DELETE: nothing a user entered is lost.
export function attachmentsRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const attachments = attachmentsService(deps);
  const upload = singleFileUpload({ maxBytesFor: uploadCapFor, absoluteMaxBytes: ATTACHMENT_ABSOLUTE_MAX_BYTES, maxFields: 4 });

  const owners: [string, AttachmentOwnerType, typeof TESTERS | typeof MANAGE][] = [
    ['faults', 'fault', TESTERS],
    ['repairs', 'repair', TESTERS],
    ['equipment', 'equipment', MANAGE],
  ];
  for (const [segment, ownerType, uploaders] of owners) {
    api.get(`/${segment}/:id/attachments`, STAFF, validate(idParams, 'params'), (req, res) => {
      res.json(attachments.list(req.user!, ownerType, String(req.params.id)));
    });
    api.post(
      `/${segment}/:id/attachments`,
      uploaders,
      validate(idParams, 'params'),
      // Object-level access before the body is read.
      (req, _res, next) => {
        attachments.checkUploadAccess(req.user!, ownerType, String(req.params.id));
        next();
      },
      upload,
      async (req, res) => {
        const out = await attachments.upload(req.user!, ownerType, String(req.params.id), uploadedFile(req), req.get('Idempotency-Key'));
        if (out.status === 201) res.location(`/api/attachments/${out.body.id}`);
        res.status(out.status).json(out.body);
      },
    );
  }

  const sendStored = (which: 'original' | 'preview') =>
    ((req, res, next) => {
      const f = attachments.file(req.user!, String(req.params.id), which);
      res.set({
        'Content-Type': f.contentType,
        'Content-Disposition': f.disposition,
        'X-Content-Type-Options': 'nosniff',
        // A stored file never runs as a page of ours, even when opened directly.
        'Content-Security-Policy': "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; sandbox",
        'Cache-Control': 'private, no-store',
        ETag: f.etag,
      });
      // The path is built from our own generated name only (the data folder itself may sit under a dot folder).
      res.sendFile(f.path, { dotfiles: 'allow', cacheControl: false, lastModified: false, etag: false }, (err) => {
        if (err && !res.headersSent) next(err);
      });
    }) as Parameters<typeof api.get>[2];

  api.get('/attachments/:id', STAFF, validate(idParams, 'params'), sendStored('original'));
  api.get('/attachments/:id/preview', STAFF, validate(idParams, 'params'), sendStored('preview'));
  api.get('/attachments/:id/analysis', STAFF, validate(idParams, 'params'), async (req, res) => {
    res.json(await attachments.analysis(req.user!, String(req.params.id)));
  });
  return api;
}
