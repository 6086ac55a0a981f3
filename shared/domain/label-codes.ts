// What a printed label's QR code says, and how a scanned (or typed) code is read back. A label
// holds a link on the app's address, so a phone's own camera opens the right screen too:
// `/s/<strip id>` opens the strip's testing screen, `/t/<asset tag>` the item (or the strip it sits on).
// A bare asset tag, as typed or as printed on older labels, is read as a tag.

export type ScannedCode = { kind: 'strip'; stripId: string } | { kind: 'tag'; assetTag: string };

export const STRIP_LABEL_PREFIX = '/s/';
export const ITEM_LABEL_PREFIX = '/t/';

export const stripLabelUrl = (origin: string, stripId: string) => `${origin}${STRIP_LABEL_PREFIX}${stripId}`;
export const itemLabelUrl = (origin: string, assetTag: string) => `${origin}${ITEM_LABEL_PREFIX}${encodeURIComponent(assetTag)}`;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
// The register's own rule for a tag (shared/schemas/equipment.ts), upper-cased as the register keeps it.
const TAG = /^[A-Z0-9][A-Z0-9._/-]{0,39}$/;

function fromPath(path: string): ScannedCode | null {
  if (path.startsWith(STRIP_LABEL_PREFIX)) {
    const id = path.slice(STRIP_LABEL_PREFIX.length);
    return UUID.test(id) ? { kind: 'strip', stripId: id.toLowerCase() } : null;
  }
  if (path.startsWith(ITEM_LABEL_PREFIX)) {
    let tag: string;
    try {
      tag = decodeURIComponent(path.slice(ITEM_LABEL_PREFIX.length)).trim().toUpperCase();
    } catch {
      return null;
    }
    return TAG.test(tag) ? { kind: 'tag', assetTag: tag } : null;
  }
  return null;
}

/** A code read from a label or typed: a strip, an asset tag, or null when it is neither. */
export function parseScannedCode(raw: string): ScannedCode | null {
  const text = raw.trim();
  if (text === '') return null;
  if (/^https?:\/\//i.test(text)) {
    let url: URL;
    try {
      url = new URL(text);
    } catch {
      return null;
    }
    return fromPath(url.pathname);
  }
  if (text.startsWith('/')) return fromPath(text);
  const tag = text.toUpperCase();
  return TAG.test(tag) ? { kind: 'tag', assetTag: tag } : null;
}
