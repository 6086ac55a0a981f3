// A photo of a cable in a hall is stored without where it was taken or which device took it: the
// EXIF location (GPS), serial numbers, maker notes, XMP and IPTC are removed, the orientation and
// the times it was taken are kept, and the picture itself is not re-encoded (ExifTool rewrites
// only the metadata, for JPEG, PNG, WebP and HEIC alike, so the pixels are the camera's own).
import { ExifTool } from 'exiftool-vendored';
import exifReader from 'exif-reader';
import sharp from 'sharp';
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';

// What stays: the orientation, the times the picture was taken, and the colour profile. The tags
// are named in the EXIF group, so they are written back as EXIF (not as XMP).
const KEEP = [
  'Orientation',
  'DateTimeOriginal',
  'CreateDate',
  'ModifyDate',
  'OffsetTime',
  'OffsetTimeOriginal',
  'OffsetTimeDigitized',
  'SubSecTime',
  'SubSecTimeOriginal',
  'SubSecTimeDigitized',
];
// Everything goes first (-all=; EXIF and XMP named again, which HEIC needs), then the kept tags
// are copied back from the file itself (-tagsFromFile @).
const ARGS = [
  '-all=',
  '-exif:all=',
  '-xmp:all=',
  '-tagsFromFile',
  '@',
  '-ICC_Profile',
  ...KEEP.map((t) => `-exif:${t}`),
  '-overwrite_original',
];

const EXTENSION: Record<string, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp', 'image/heic': 'heic' };

let tool: ExifTool | null = null;
/** One ExifTool process for the server, started on the first photo. */
const exiftool = () => (tool ??= new ExifTool({ maxProcs: 1, taskTimeoutMillis: 30_000 }));

/** Stops the ExifTool process (at shutdown; the next photo would start another). */
export async function endPhotoMetadataTool() {
  const t = tool;
  tool = null;
  await t?.end();
}

export class PhotoMetadataError extends Error {}

/**
 * What the stored photo must not carry, read back with sharp and exif-reader (a second reader,
 * so a file ExifTool could not clean is never stored as if it were clean).
 */
export async function identifyingMetadata(bytes: Buffer): Promise<string[]> {
  const m = await sharp(bytes, { failOn: 'none' }).metadata();
  const found: string[] = [];
  if (m.xmp) found.push('XMP');
  if (m.iptc) found.push('IPTC');
  if (m.exif) {
    const exif = exifReader(m.exif) as unknown as Record<string, Record<string, unknown> | undefined>;
    if (exif.GPSInfo && Object.keys(exif.GPSInfo).length > 0) found.push('GPS');
    for (const [group, tags] of Object.entries(exif)) {
      if (tags && typeof tags === 'object')
        for (const tag of Object.keys(tags)) if (/serial|owner|makernote|uniqueid|artist/i.test(tag)) found.push(`${group}.${tag}`);
    }
  }
  return found;
}

/**
 * The photo with its identifying metadata removed. `workDir` holds the file while ExifTool
 * rewrites it (the attachments folder: photos never leave the app's own data).
 */
export async function removeIdentifyingMetadata(bytes: Buffer, contentType: string, workDir: string): Promise<Buffer> {
  const ext = EXTENSION[contentType];
  if (!ext) throw new PhotoMetadataError(`No metadata rewriting for ${contentType}.`);
  const file = join(workDir, `.incoming-${randomUUID()}.${ext}`);
  try {
    writeFileSync(file, bytes, { mode: 0o600, flag: 'wx' });
    await exiftool().write(file, {}, { writeArgs: ARGS });
    const cleaned = readFileSync(file);
    const left = await identifyingMetadata(cleaned);
    if (left.length > 0) throw new PhotoMetadataError(`Still in the file after cleaning: ${left.join(', ')}.`);
    return cleaned;
  } catch (err) {
    if (err instanceof PhotoMetadataError) throw err;
    throw new PhotoMetadataError((err as Error).message);
  } finally {
    rmSync(file, { force: true });
    // ExifTool writes beside the file and renames; a failure may leave its temporary copy.
    rmSync(`${file}_exiftool_tmp`, { force: true });
  }
}
