// Attachments: photos, oscilloscope traces and PDFs on faults, repairs and register items.
// An upload is checked completely (owner, name, size, bytes against the extension, a trace that
// parses, a photo that decodes) before anything is written; then the files, then the row in one
// transaction, and the files are removed again if the transaction fails.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { attachmentsRepository, type AttachmentRow } from '../db/attachments.repository';
import type { EquipmentRow } from '../db/equipment.repository';
import { recordAudit } from '../db/audit.repository';
import { attachmentStore, type AttachmentStore } from '../storage/attachment-store';
import { accessService } from './access.service';
import { conflict, forbidden, notFound, unprocessable } from '../lib/app-error';
import { newId, nowIso, sha256Hex } from '../lib/ids';
import { tooLarge, type UploadedFile } from '../http/upload';
import {
  ATTACHMENT_MAX_BYTES,
  idempotencyKeyHeader,
  type AttachmentCreated,
  type AttachmentDto,
  type AttachmentOwnerType,
  type TraceAnalysisDto,
} from '../../shared/schemas/attachments';
import { bindScope } from './bind';
import {
  checkContent,
  classifyUploadName,
  contentDisposition,
  INLINE_TYPES,
  makePreview,
  withoutIdentifyingMetadata,
} from './attachment-files';

export { uploadCapFor } from './attachment-files';

interface Owner {
  orgId: string;
  venueId: string | null;
  equipment: EquipmentRow | null;
}

interface StoredAnswer {
  status: 200 | 201;
  body: AttachmentCreated;
}

function scopeOf(deps: AppDeps, store: AttachmentStore = attachmentStore(deps.env.DATA_DIR)) {
  const access = accessService(deps.db);
  const repo = attachmentsRepository(deps.db);
  /** Idempotency keys whose first request is still being processed (→ 409 for a parallel retry). */
  const inFlight = new Set<string>();
  const created = (row: AttachmentRow): AttachmentCreated => ({
    id: row.id,
    kind: row.kind,
    contentType: row.contentType,
    size: row.size,
    sha256: row.sha256,
  });
  return { deps, store, access, repo, inFlight, created };
}
type Scope = ReturnType<typeof scopeOf>;

function requireOwner(
  { access, repo }: Scope,
  user: AuthUser,
  ownerType: AttachmentOwnerType,
  ownerId: string,
  mode: 'read' | 'write',
): Owner {
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

function present(_scope: Scope, row: AttachmentRow, createdByName: string | null): AttachmentDto {
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

function checkIdempotency({ repo }: Scope, user: AuthUser, key: string, requestHash: string): StoredAnswer | null {
  const existing = repo.findIdempotency(key);
  if (!existing) return null;
  if (existing.userId !== user.id || existing.requestHash !== requestHash) {
    throw unprocessable(
      'idempotency-key-reused',
      'This Idempotency-Key was already used for a different upload; choose the file again to send it as a new upload.',
    );
  }
  return { status: existing.status as 200 | 201, body: JSON.parse(existing.responseJson) as AttachmentCreated };
}

/** Run before the body is read, so a stranger's upload is refused without taking it in. */
function checkUploadAccess(scope: Scope, user: AuthUser, ownerType: AttachmentOwnerType, ownerId: string) {
  requireOwner(scope, user, ownerType, ownerId, 'write');
}

type Remember = (tx: Parameters<Parameters<AppDeps['db']['transaction']>[0]>[0], answer: StoredAnswer) => StoredAnswer;

/** The files first, then the row and its audit entry in one transaction; the files go again if that fails. */
function writeNew(
  scope: Scope,
  a: {
    user: AuthUser;
    owner: Owner;
    ownerType: AttachmentOwnerType;
    ownerId: string;
    kind: AttachmentRow['kind'];
    contentType: string;
    bytes: Buffer;
    sha256: string;
    preview: Buffer | null;
    originalName: string;
    remember: Remember;
  },
): StoredAnswer {
  const { deps, store, created } = scope;
  const { user, owner, ownerType, ownerId, contentType, bytes, sha256, preview, originalName, remember } = a;
  const known = { kind: a.kind };
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
      recordAudit(tx, { orgId: owner.orgId, id: user.id }, 'attachment.added', ownerType, ownerId, {
        attachmentId: id,
        kind: known.kind,
        contentType,
        size: row.size,
        sha256,
        originalName,
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
}

async function upload(
  scope: Scope,
  user: AuthUser,
  ownerType: AttachmentOwnerType,
  ownerId: string,
  file: UploadedFile,
  idempotencyKey: string | undefined,
): Promise<StoredAnswer> {
  const { deps, store, repo, inFlight, created } = scope;
  const owner = requireOwner(scope, user, ownerType, ownerId, 'write');
  const key = idempotencyKey === undefined ? undefined : idempotencyKeyHeader.parse(idempotencyKey.trim().toLowerCase());

  const { name: originalName, ext, kind } = classifyUploadName(file.originalname);
  const known = { kind };
  if (file.size === 0 || file.buffer.length === 0) {
    throw unprocessable('empty-file', 'The file is empty (0 bytes); choose the file again.', {
      errors: [{ path: 'file', message: 'Empty file' }],
    });
  }
  const max = ATTACHMENT_MAX_BYTES[known.kind];
  if (file.buffer.length > max) throw tooLarge(max);

  // The request is known by the bytes sent; the attachment by the bytes stored (a photo loses
  // its identifying metadata first).
  const requestHash = sha256Hex(`${ownerType}:${ownerId}:${sha256Hex(file.buffer)}`);
  if (key) {
    const replay = checkIdempotency(scope, user, key, requestHash);
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

    const contentType = await checkContent(deps.workers, file.buffer, ext);
    // A photo must decode (the preview) before its metadata is rewritten; the preview has none.
    const preview = known.kind === 'photo' ? await makePreview(file.buffer, contentType) : null;
    const bytes = known.kind === 'photo' ? await withoutIdentifyingMetadata(deps.log, store.dir, file.buffer, contentType) : file.buffer;
    const sha256 = sha256Hex(bytes);
    // The same bytes on the same owner are one attachment: a retry without a key lands here.
    const same = repo.sameBytes(ownerType, ownerId, sha256);
    if (same) return deps.db.transaction((tx) => remember(tx, { status: 200, body: created(same) }));

    return writeNew(scope, {
      user,
      owner,
      ownerType,
      ownerId,
      kind: known.kind,
      contentType,
      bytes,
      sha256,
      preview,
      originalName,
      remember,
    });
  } finally {
    if (key) inFlight.delete(key);
  }
}

function list(scope: Scope, user: AuthUser, ownerType: AttachmentOwnerType, ownerId: string): AttachmentDto[] {
  const { repo } = scope;
  requireOwner(scope, user, ownerType, ownerId, 'read');
  return repo.ofOwner(ownerType, ownerId).map((r) => present(scope, r.attachment, r.createdByName));
}

/** The row and where its bytes are, for those who may see the owner. */
function file(scope: Scope, user: AuthUser, id: string, which: 'original' | 'preview') {
  const { store, repo } = scope;
  const found = repo.findById(id);
  if (!found) throw notFound('That attachment');
  const row = found.attachment;
  requireOwner(scope, user, row.ownerType, row.ownerId, 'read');
  if (which === 'preview') {
    if (!row.previewName) throw notFound('A preview of that attachment');
    return {
      path: store.pathOf(row.previewName),
      contentType: 'image/jpeg',
      disposition: contentDisposition('inline', `preview-${row.originalName.replace(/\.[^.]*$/, '')}.jpg`),
      etag: `"${row.sha256}-p"`,
    };
  }
  const inline = INLINE_TYPES.has(row.contentType);
  return {
    path: store.pathOf(row.storedName),
    contentType: row.contentType === 'text/csv' ? 'text/csv; charset=utf-8' : row.contentType,
    disposition: contentDisposition(inline ? 'inline' : 'attachment', row.originalName),
    etag: `"${row.sha256}"`,
  };
}

/** The trace through the waveform engine (on a worker thread) with the owner's item's velocity factor, and points for the plot. */
async function analysis(scope: Scope, user: AuthUser, id: string): Promise<TraceAnalysisDto> {
  const { deps, store, repo } = scope;
  const found = repo.findById(id);
  if (!found) throw notFound('That attachment');
  const row = found.attachment;
  const owner = requireOwner(scope, user, row.ownerType, row.ownerId, 'read');
  if (row.kind !== 'trace') throw unprocessable('not-a-trace', 'Only a trace (CSV) attachment can be analysed.');
  const item = owner.equipment;
  const velocityFactor = item?.velocityFactor ?? null;
  const lengthM = item?.lengthM ?? null;
  const result = await deps.workers.run('storedTraceAnalysis', {
    path: store.pathOf(row.storedName),
    velocityFactor,
    lengthM,
    units: user.unitSystem,
  });
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
}

export function attachmentsService(deps: AppDeps, store: AttachmentStore = attachmentStore(deps.env.DATA_DIR)) {
  return bindScope(scopeOf(deps, store), { checkUploadAccess, upload, list, file, analysis });
}
