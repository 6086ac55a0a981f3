import type { RequestHandler } from 'express';
import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { singleFileUpload, uploadedFile } from '../http/upload';
import { ATTACHMENT_ABSOLUTE_MAX_BYTES, type AttachmentOwnerType } from '../../shared/schemas/attachments';
import { attachmentsContracts as c } from '../../shared/contracts/attachments';
import { attachmentsService, uploadCapFor } from '../services/attachments.service';

// Uploads: faults and repairs by those who may test the venue, register items by those who keep
// the register. Reading: whoever may see the owner. There is no DELETE: nothing a user entered is lost.
export function attachmentsRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const attachments = attachmentsService(deps);
  const upload = singleFileUpload({ maxBytesFor: uploadCapFor, absoluteMaxBytes: ATTACHMENT_ABSOLUTE_MAX_BYTES, maxFields: 4 });

  for (const ownerType of ['fault', 'repair', 'equipment'] as const satisfies readonly AttachmentOwnerType[]) {
    const owner = c[ownerType];
    // Object-level access before the body is read.
    const mayUpload: RequestHandler = (req, _res, next) => {
      attachments.checkUploadAccess(req.user!, ownerType, String(req.params.id));
      next();
    };
    api.route(owner.list, ({ user, params }) => attachments.list(user, ownerType, params.id));
    api.route(
      owner.upload,
      async ({ user, params, req, res }) => {
        const out = await attachments.upload(user, ownerType, params.id, uploadedFile(req), req.get('Idempotency-Key'));
        res.status(out.status);
        if (out.status === 201) res.location(`/api/attachments/${out.body.id}`);
        return out.body;
      },
      { before: [mayUpload, upload] },
    );
  }

  const sendStored =
    (which: 'original' | 'preview') =>
    ({ user, params, res }: { user: NonNullable<Express.Request['user']>; params: { id: string }; res: Parameters<RequestHandler>[1] }) =>
      new Promise<void>((resolve, reject) => {
        const f = attachments.file(user, params.id, which);
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
          if (err && !res.headersSent) reject(err);
          else resolve();
        });
      });

  api.route(c.original, sendStored('original'));
  api.route(c.preview, sendStored('preview'));
  api.route(c.analysis, async ({ user, params }) => attachments.analysis(user, params.id));
  return api;
}
