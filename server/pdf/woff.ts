// A .woff font unpacked into the plain TrueType/OpenType file (sfnt) it wraps, with Node's own zlib.
// Why: fontkit reads a .woff table by inflating it in JavaScript each time it is asked for it, and
// asks for the whole glyph table once per glyph it draws or embeds, so a two-page strip
// certificate spent most of its 250 ms inflating the same tables again and again (profiled:
// tiny-inflate was half of the rendering's CPU time). Unpacked once per process, they are only read.
// Layout from the W3C WOFF File Format 1.0 recommendation (§3 header, §4 table directory, §5 table
// data) and the OpenType specification's table directory (searchRange, entrySelector, rangeShift).
import { inflateSync } from 'node:zlib';

const WOFF_SIGNATURE = 0x774f4646; // 'wOFF'
const WOFF_HEADER_BYTES = 44;
const WOFF_ENTRY_BYTES = 20;
const SFNT_HEADER_BYTES = 12;
const SFNT_RECORD_BYTES = 16;

const pad4 = (n: number) => (n + 3) & ~3;

function bad(why: string): Error {
  return new Error(`Not a usable .woff font: ${why}.`);
}

export function sfntFromWoff(woff: Buffer): Buffer {
  if (woff.length < WOFF_HEADER_BYTES || woff.readUInt32BE(0) !== WOFF_SIGNATURE) throw bad('no WOFF signature');
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  if (woff.length < WOFF_HEADER_BYTES + numTables * WOFF_ENTRY_BYTES) throw bad('its table directory is cut short');

  const tables: { tag: number; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < numTables; i++) {
    const at = WOFF_HEADER_BYTES + i * WOFF_ENTRY_BYTES;
    const tag = woff.readUInt32BE(at);
    const offset = woff.readUInt32BE(at + 4);
    const compLength = woff.readUInt32BE(at + 8);
    const origLength = woff.readUInt32BE(at + 12);
    const checksum = woff.readUInt32BE(at + 16);
    if (offset + compLength > woff.length) throw bad('a table lies outside the file');
    const stored = woff.subarray(offset, offset + compLength);
    // §5: a table is zlib-compressed exactly when that made it smaller.
    const data = compLength < origLength ? inflateSync(stored) : stored;
    if (data.length !== origLength) throw bad('a table does not unpack to its declared length');
    tables.push({ tag, checksum, data });
  }

  const entrySelector = Math.floor(Math.log2(numTables));
  const searchRange = 2 ** entrySelector * 16;
  let offset = SFNT_HEADER_BYTES + numTables * SFNT_RECORD_BYTES;
  const size = tables.reduce((n, t) => n + pad4(t.data.length), offset);
  const out = Buffer.alloc(size); // zero-filled, so each table's padding is zeros
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(searchRange, 6);
  out.writeUInt16BE(entrySelector, 8);
  out.writeUInt16BE(numTables * 16 - searchRange, 10);
  // The WOFF directory is in ascending tag order (§4), which the sfnt directory needs too.
  tables.forEach((t, i) => {
    const rec = SFNT_HEADER_BYTES + i * SFNT_RECORD_BYTES;
    out.writeUInt32BE(t.tag, rec);
    out.writeUInt32BE(t.checksum, rec + 4);
    out.writeUInt32BE(offset, rec + 8);
    out.writeUInt32BE(t.data.length, rec + 12);
    t.data.copy(out, offset);
    offset += pad4(t.data.length);
  });
  return out;
}
