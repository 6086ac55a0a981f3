// Attachments: photos, oscilloscope traces and PDFs on faults, repairs and register items.
// An upload is checked completely (owner, name, size, bytes against the extension, a trace that
// parses, a photo that decodes) before anything is written; then the files, then the row in one
// transaction, and the files are removed again if the transaction fails.
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import heicConvert from 'heic-convert';
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { attachmentsRepository, type AttachmentRow } from '../db/attachments.repository';
import type { EquipmentRow } from '../db/equipment.repository';
import { writeAudit } from '../db/audit.repository';
import { attachmentStore, type AttachmentStore } from '../storage/attachment-store';
import { ownBytes } from '../workers/pool';
import { PhotoMetadataError, removeIdentifyingMetadata } from '../storage/photo-metadata';
import { accessService } from './access.service';
import { AppError, conflict, forbidden, notFound, unprocessable } from '../lib/app-error';
import { newId, nowIso, sha256Hex } from '../lib/ids';
import { tooLarge, type UploadedFile } from '../http/upload';
import {
  ATTACHMENT_EXTENSIONS,
  ATTACHMENT_MAX_BYTES,
  extensionOf,
  idempotencyKeyHeader,
  type AttachmentCreated,
  type AttachmentDto,
  type AttachmentOwnerType,
  type TraceAnalysisDto,
} from '../../shared/schemas/attachments';

const PREVIEW_PX = 480;
/** Decoding limit for photos (a "pixel bomb" is refused before it fills memory). */
const MAX_INPUT_PIXELS = 100_000_000;

const unsupported = (code: string, message: string) => new AppError(415, code, message);
const acceptedList = Object.keys(ATTACHMENT_EXTENSIONS)
  .map((e) => `.${e}`)
  .join(', ');

/**
 * The name kept as metadata: the last path segment, without control or bidirectional-override
 * characters, trimmed, no leading dots, at most 200 characters (keeping the extension). Such a
 * name is accepted and cleaned; one that is empty once cleaned is refused (422).
 */
export function cleanFileName(raw: string): string {
  let s = (raw ?? '').normalize('NFC');
  s = s.split(/[\\/]/).pop() ?? '';
  // eslint-disable-next-line no-control-regex
  s = s.replace(/[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u202a-\u202e\u2066-\u2069\ufeff]/g, '');
  s = s.trim().replace(/^\.+/, '').trim();
  if (s.length > 200) {
    const ext = extensionOf(s);
    s = ext && ext.length < 10 ? `${s.slice(0, 199 - ext.length)}.${ext}` : s.slice(0, 200);
  }
  return s;
}

const badName = () =>
  unprocessable('bad-file-name', 'The file name is empty once path separators and control characters are taken out; rename the file.', {
    errors: [{ path: 'file', message: 'The file needs a name' }],
  });

/** The cleaned name, its extension and what it may hold; 422 for a name that cleans to nothing, 415 for a type we do not take. */
export function classifyUploadName(raw: string) {
  const name = cleanFileName(raw);
  if (!name) throw badName();
  const ext = extensionOf(name);
  const known = ATTACHMENT_EXTENSIONS[ext];
  if (!known) throw unsupported('unsupported-type', `Files of this type cannot be attached; accepted: ${acceptedList}.`);
  return { name, ext, ...known };
}

/** The size cap from the (client-given) name; used while the bytes are still arriving. */
export const uploadCapFor = (originalName: string): number => ATTACHMENT_MAX_BYTES[classifyUploadName(originalName).kind];

/** RFC 6266 Content-Disposition with an ASCII fallback and the exact name in filename* (RFC 8187). */
export function contentDisposition(type: 'inline' | 'attachment', name: string): string {
  const ext = extensionOf(name);
  const ascii =
    name
      .normalize('NFKD')
      .replace(/[^\x20-\x7e]/g, '')
      .replace(/["\\%;]/g, '_')
      .replace(/\s+/g, ' ')
      .trim() || `attachment${ext ? `.${ext}` : ''}`;
  const encoded = encodeURIComponent(name).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `${type}; filename="${ascii}"; filename*=UTF-8''${encoded}`;
}

const toBuffer = (b: ArrayBuffer | Buffer) => (Buffer.isBuffer(b) ? b : Buffer.from(new Uint8Array(b)));

const INLINE_TYPES = new Set(['image/jpeg', 'image/png', 'image/webp']);
const HEIF_TYPES = new Set(['image/heic', 'image/heif', 'image/heic-sequence', 'image/heif-sequence']);

interface Owner {
  orgId: string;
  venueId: string | null;
  equipment: EquipmentRow | null;
}

interface StoredAnswer {
  status: 200 | 201;
  body: AttachmentCreated;
}

export function attachmentsService(deps: AppDeps, store: AttachmentStore = attachmentStore(deps.env.DATA_DIR)) {
  const access = accessService(deps.db);
  const repo = attachmentsRepository(deps.db);
  /** Idempotency keys whose first request is still being processed (→ 409 for a parallel retry). */
  const inFlight = new Set<string>();

  function requireOwner(user: AuthUser, ownerType: AttachmentOwnerType, ownerId: string, mode: 'read' | 'write'): Owner {
    if (ownerType === 'equipment') {
      const item = repo.equipmentOwner(ownerId);
      if (!item || item.orgId !== user.orgId) throw notFound('That item');
      if (mode === 'write' && user.role !== 'admin' && user.role !== 'director') {
        throw forbidden('Only an administrator or a technical director can add files to a register item.');
      }
      return { orgId: item.orgId, venueId: null, equipment: item };
    }
    const row = ownerType === 'fault' ? repo.faultOwner(ownerId) : repo.repairOwner(ownerId);
    if (!row) throw notFound(ownerType === 'fault' ? 'That fault' : 'That repair');
    const venue = access.requireVenue(user, row.venueId, mode === 'write' ? 'test' : 'read');
    return { orgId: venue.event.orgId, venueId: row.venueId, equipment: row.equipment ?? null };
  }

  function present(row: AttachmentRow, createdByName: string | null): AttachmentDto {
    return {
      id: row.id,
      ownerType: row.ownerType,
      ownerId: row.ownerId,
      kind: row.kind,
      contentType: row.contentType,
      size: row.size,
      sha256: row.sha256,
      originalName: row.originalName,
      hasPreview: row.previewName !== null,
      createdAt: row.createdAt,
      createdBy: row.createdBy,
      createdByName,
      url: `/api/attachments/${row.id}`,
      previewUrl: row.previewName ? `/api/attachments/${row.id}/preview` : null,
      analysisUrl: row.kind === 'trace' ? `/api/attachments/${row.id}/analysis` : null,
    };
  }

  const created = (row: AttachmentRow): AttachmentCreated => ({
    id: row.id,
    kind: row.kind,
    contentType: row.contentType,
    size: row.size,
    sha256: row.sha256,
  });

  /** The content type the bytes really have, if it agrees with the extension; else 415 (or 422 for a trace that is text but no trace). */
  async function checkContent(bytes: Buffer, ext: string): Promise<string> {
    const expected = ATTACHMENT_EXTENSIONS[ext]!;
    const detected = await fileTypeFromBuffer(bytes);
    if (expected.kind === 'trace') {
      if (detected) {
        throw unsupported('content-mismatch', `The file is named .${ext} but its content is ${detected.mime}; a trace is a text (CSV) file.`);
      }
      if (bytes.includes(0)) throw unsupported('content-mismatch', 'The file is named as a CSV trace but holds binary data (NUL bytes).');
      // Decoded and parsed on a worker thread (a trace may be 64 MB), from a copy: the bytes are stored next.
      const copy = new Uint8Array(bytes);
      await deps.workers.run('checkTrace', { bytes: copy }, [copy.buffer]);
      return 'text/csv';
    }
    if (!detected) {
      throw unsupported('content-mismatch', `The file is named .${ext} but its content is not recognised as ${expected.contentType}.`);
    }
    const agrees =
      expected.contentType === 'image/heic' || expected.contentType === 'image/heif'
        ? HEIF_TYPES.has(detected.mime)
        : detected.mime === expected.contentType;
    if (!agrees) {
      throw unsupported('content-mismatch', `The file is named .${ext} but its content is ${detected.mime}; rename it or export it again.`);
    }
    return HEIF_TYPES.has(detected.mime) ? 'image/heic' : detected.mime;
  }

  /** A 480 px JPEG of a photo; a photo that does not decode is refused as not what it claims. */
  async function makePreview(bytes: Buffer, contentType: string): Promise<Buffer> {
    try {
      const source = HEIF_TYPES.has(contentType)
        ? toBuffer(await heicConvert({ buffer: bytes, format: 'JPEG', quality: 0.9 }))
        : bytes;
      return await sharp(source, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' })
        .rotate()
        .resize(PREVIEW_PX, PREVIEW_PX, { fit: 'inside', withoutEnlargement: true })
        .jpeg({ quality: 80, mozjpeg: true })
        .toBuffer();
    } catch {
      throw unsupported('unreadable-image', 'The photo could not be read as an image (damaged, or too large to decode); take it again or export it as JPEG.');
    }
  }

  /** The photo as stored: without location, serial numbers and the like, picture untouched. */
  async function withoutIdentifyingMetadata(bytes: Buffer, contentType: string): Promise<Buffer> {
    try {
      return await removeIdentifyingMetadata(bytes, contentType, store.dir);
    } catch (err) {
      if (!(err instanceof PhotoMetadataError)) throw err;
      deps.log.error('photo metadata could not be removed', err);
      throw unprocessable('photo-metadata', 'The location and device details could not be removed from this photo, so it was not stored; take it again or export it as JPEG.');
    }
  }

  function checkIdempotency(user: AuthUser, key: string, requestHash: string): StoredAnswer | null {
    const existing = repo.findIdempotency(key);
    if (!existing) return null;
    if (existing.userId !== user.id || existing.requestHash !== requestHash) {
      throw unprocessable('idempotency-key-reused', 'This Idempotency-Key was already used for a different upload; choose the file again to send it as a new upload.');
    }
    return { status: existing.status as 200 | 201, body: JSON.parse(existing.responseJson) as AttachmentCreated };
  }

  return {
    /** Run before the body is read, so a stranger's upload is refused without taking it in. */
    checkUploadAccess: (user: AuthUser, ownerType: AttachmentOwnerType, ownerId: string) => {
      requireOwner(user, ownerType, ownerId, 'write');
    },

    async upload(
      user: AuthUser,
      ownerType: AttachmentOwnerType,
      ownerId: string,
      file: UploadedFile,
      idempotencyKey: string | undefined,
    ): Promise<StoredAnswer> {
      const owner = requireOwner(user, ownerType, ownerId, 'write');
      const key = idempotencyKey === undefined ? undefined : idempotencyKeyHeader.parse(idempotencyKey.trim().toLowerCase());

      const { name: originalName, ext, kind } = classifyUploadName(file.originalname);
      const known = { kind };
      if (file.size === 0 || file.buffer.length === 0) {
        throw unprocessable('empty-file', 'The file is empty (0 bytes); choose the file again.', { errors: [{ path: 'file', message: 'Empty file' }] });
      }
      const max = ATTACHMENT_MAX_BYTES[known.kind];
      if (file.buffer.length > max) throw tooLarge(max);

      // The request is known by the bytes sent; the attachment by the bytes stored (a photo loses
      // its identifying metadata first).
      const requestHash = sha256Hex(`${ownerType}:${ownerId}:${sha256Hex(file.buffer)}`);
      if (key) {
        const replay = checkIdempotency(user, key, requestHash);
        if (replay) return replay;
        if (inFlight.has(key)) throw conflict('idempotency-in-flight', 'This upload is still being processed; wait for it to finish.');
        inFlight.add(key);
      }
      try {
        const remember = (tx: Parameters<Parameters<typeof deps.db.transaction>[0]>[0], answer: StoredAnswer) => {
          if (key) {
            attachmentsRepository(tx).insertIdempotency({
              key,
              userId: user.id,
              requestHash,
              status: answer.status,
              responseJson: JSON.stringify(answer.body),
              createdAt: nowIso(),
            });
          }
          return answer;
        };

        const contentType = await checkContent(file.buffer, ext);
        // A photo must decode (the preview) before its metadata is rewritten; the preview has none.
        const preview = known.kind === 'photo' ? await makePreview(file.buffer, contentType) : null;
        const bytes = known.kind === 'photo' ? await withoutIdentifyingMetadata(file.buffer, contentType) : file.buffer;
        const sha256 = sha256Hex(bytes);
        // The same bytes on the same owner are one attachment: a retry without a key lands here.
        const same = repo.sameBytes(ownerType, ownerId, sha256);
        if (same) return deps.db.transaction((tx) => remember(tx, { status: 200, body: created(same) }));

        const storedName = store.write(bytes);
        let previewName: string | null = null;
        try {
          if (preview) previewName = store.write(preview, '.preview.jpg');
          const id = newId();
          const answer = deps.db.transaction((tx) => {
            const r = attachmentsRepository(tx);
            // Checked again inside the transaction: a parallel upload of the same bytes may have won.
            const raced = r.sameBytes(ownerType, ownerId, sha256);
            if (raced) return { raced: true, answer: remember(tx, { status: 200, body: created(raced) }) };
            const row: AttachmentRow = {
              id,
              ownerType,
              ownerId,
              kind: known.kind,
              contentType,
              size: bytes.length,
              sha256,
              storedName,
              originalName,
              previewName,
              createdBy: user.id,
              createdAt: nowIso(),
            };
            r.insert(row);
            writeAudit(tx, {
              orgId: owner.orgId,
              actorId: user.id,
              action: 'attachment.added',
              entityType: ownerType,
              entityId: ownerId,
              detail: { attachmentId: id, kind: known.kind, contentType, size: row.size, sha256, originalName },
            });
            return { raced: false, answer: remember(tx, { status: 201, body: created(row) }) };
          });
          if (answer.raced) {
            store.remove(storedName);
            store.remove(previewName);
          }
          return answer.answer;
        } catch (err) {
          store.remove(storedName);
          store.remove(previewName);
          throw err;
        }
      } finally {
        if (key) inFlight.delete(key);
      }
    },

    list(user: AuthUser, ownerType: AttachmentOwnerType, ownerId: string): AttachmentDto[] {
      requireOwner(user, ownerType, ownerId, 'read');
      return repo.ofOwner(ownerType, ownerId).map((r) => present(r.attachment, r.createdByName));
    },

    /** The row and where its bytes are, for those who may see the owner. */
    file(user: AuthUser, id: string, which: 'original' | 'preview') {
      const found = repo.findById(id);
      if (!found) throw notFound('That attachment');
      const row = found.attachment;
      requireOwner(user, row.ownerType, row.ownerId, 'read');
      if (which === 'preview') {
        if (!row.previewName) throw notFound('A preview of that attachment');
        return { path: store.pathOf(row.previewName), contentType: 'image/jpeg', disposition: contentDisposition('inline', `preview-${row.originalName.replace(/\.[^.]*$/, '')}.jpg`), etag: `"${row.sha256}-p"` };
      }
      const inline = INLINE_TYPES.has(row.contentType);
      return {
        path: store.pathOf(row.storedName),
        contentType: row.contentType === 'text/csv' ? 'text/csv; charset=utf-8' : row.contentType,
        disposition: contentDisposition(inline ? 'inline' : 'attachment', row.originalName),
        etag: `"${row.sha256}"`,
      };
    },

    /** The trace through the waveform engine (on a worker thread) with the owner's item's velocity factor, and points for the plot. */
    async analysis(user: AuthUser, id: string): Promise<TraceAnalysisDto> {
      const found = repo.findById(id);
      if (!found) throw notFound('That attachment');
      const row = found.attachment;
      const owner = requireOwner(user, row.ownerType, row.ownerId, 'read');
      if (row.kind !== 'trace') throw unprocessable('not-a-trace', 'Only a trace (CSV) attachment can be analysed.');
      const item = owner.equipment;
      const velocityFactor = item?.velocityFactor ?? null;
      const lengthM = item?.lengthM ?? null;
      const bytes = ownBytes(await store.readAsync(row.storedName));
      const result = await deps.workers.run('storedTraceAnalysis', {
        bytes,
        velocityFactor,
        lengthM,
        units: user.unitSystem,
      }, [bytes.buffer]);
      return {
        attachmentId: row.id,
        originalName: row.originalName,
        sampleCount: result.sampleCount,
        skippedLines: result.skippedLines,
        velocityFactor,
        velocityFactorSource: item && velocityFactor !== null ? `${item.assetTag} in the register` : null,
        lengthM,
        points: result.points,
        analysis: result.analysis,
        problem: result.problem,
      };
    },
  };
}

