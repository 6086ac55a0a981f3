// One uploaded file checked whole before anything is written (OWASP ASVS 5.2, 5.3.2, 5.4.1): its
// name cleaned, its kind and size cap from the extension, its bytes against that extension (a
// trace that parses, a photo that decodes), and a photo's identifying metadata removed.
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import heicConvert from 'heic-convert';
import type { AppDeps } from '../deps';
import { PhotoMetadataError, removeIdentifyingMetadata } from '../storage/photo-metadata';
import { AppError, unprocessable } from '../lib/app-error';
import { ATTACHMENT_EXTENSIONS, ATTACHMENT_MAX_BYTES, extensionOf } from '../../shared/schemas/attachments';

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

export const INLINE_TYPES = new Set(['image/jpeg', 'image/png', 'image/webp']);
const HEIF_TYPES = new Set(['image/heic', 'image/heif', 'image/heic-sequence', 'image/heif-sequence']);

/** The content type the bytes really have, if it agrees with the extension; else 415 (or 422 for a trace that is text but no trace). */
export async function checkContent(workers: AppDeps['workers'], bytes: Buffer, ext: string): Promise<string> {
  const expected = ATTACHMENT_EXTENSIONS[ext]!;
  const detected = await fileTypeFromBuffer(bytes);
  if (expected.kind === 'trace') {
    if (detected) {
      throw unsupported('content-mismatch', `The file is named .${ext} but its content is ${detected.mime}; a trace is a text (CSV) file.`);
    }
    if (bytes.includes(0)) throw unsupported('content-mismatch', 'The file is named as a CSV trace but holds binary data (NUL bytes).');
    // Decoded and parsed on a worker thread (a trace may be 64 MB), from a copy: the bytes are stored next.
    const copy = new Uint8Array(bytes);
    await workers.run('checkTrace', { bytes: copy }, [copy.buffer]);
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
export async function makePreview(bytes: Buffer, contentType: string): Promise<Buffer> {
  try {
    const source = HEIF_TYPES.has(contentType) ? toBuffer(await heicConvert({ buffer: bytes, format: 'JPEG', quality: 0.9 })) : bytes;
    return await sharp(source, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' })
      .rotate()
      .resize(PREVIEW_PX, PREVIEW_PX, { fit: 'inside', withoutEnlargement: true })
      .jpeg({ quality: 80, mozjpeg: true })
      .toBuffer();
  } catch {
    throw unsupported(
      'unreadable-image',
      'The photo could not be read as an image (damaged, or too large to decode); take it again or export it as JPEG.',
    );
  }
}

/** The photo as stored: without location, serial numbers and the like, picture untouched. */
export async function withoutIdentifyingMetadata(
  log: AppDeps['log'],
  workDir: string,
  bytes: Buffer,
  contentType: string,
): Promise<Buffer> {
  try {
    return await removeIdentifyingMetadata(bytes, contentType, workDir);
  } catch (err) {
    if (!(err instanceof PhotoMetadataError)) throw err;
    log.error('photo metadata could not be removed', err);
    throw unprocessable(
      'photo-metadata',
      'The location and device details could not be removed from this photo, so it was not stored; take it again or export it as JPEG.',
    );
  }
}
