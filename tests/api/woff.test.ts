// The .woff fonts unpacked for the certificates (server/pdf/woff.ts), checked against what the font
// files themselves declare (W3C WOFF File Format 1.0, §4: each table's origLength and
// origChecksum, the checksum of the table in the original font as the OpenType specification
// defines it) and against fontkit's own .woff reader, through pdfkit.
import { describe, expect, test } from 'vitest';
import PDFDocument from 'pdfkit';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { sfntFromWoff } from '../../server/pdf/woff';

const FONT_DIR = join(import.meta.dirname, '../../server/pdf/fonts');
const files = readdirSync(FONT_DIR).filter((f) => f.endsWith('.woff'));

/** OpenType: the sum of the table's big-endian uint32 words, zero-padded, modulo 2³². */
function checksum(table: Buffer): number {
  const padded = Buffer.alloc((table.length + 3) & ~3);
  table.copy(padded);
  let sum = 0;
  for (let i = 0; i < padded.length; i += 4) sum = (sum + padded.readUInt32BE(i)) >>> 0;
  return sum;
}

interface Entry {
  tag: string;
  origLength: number;
  origChecksum: number;
}

/** The WOFF table directory, as §4 lays it out (20 bytes each, after the 44-byte header). */
function woffDirectory(woff: Buffer): Entry[] {
  return Array.from({ length: woff.readUInt16BE(12) }, (_, i) => {
    const at = 44 + i * 20;
    return { tag: woff.toString('latin1', at, at + 4), origLength: woff.readUInt32BE(at + 12), origChecksum: woff.readUInt32BE(at + 16) };
  });
}

/** The sfnt table directory (12-byte header, 16-byte records): tag → the table's bytes. */
function sfntTables(sfnt: Buffer): Map<string, Buffer> {
  const tables = new Map<string, Buffer>();
  for (let i = 0; i < sfnt.readUInt16BE(4); i++) {
    const at = 12 + i * 16;
    const offset = sfnt.readUInt32BE(at + 8);
    tables.set(sfnt.toString('latin1', at, at + 4), sfnt.subarray(offset, offset + sfnt.readUInt32BE(at + 12)));
  }
  return tables;
}

/** Widths pdfkit measures with a font, at 10 pt. */
function widths(font: Buffer, texts: string[]): number[] {
  const doc = new PDFDocument({ autoFirstPage: false });
  doc.registerFont('f', font);
  doc.font('f').fontSize(10);
  return texts.map((t) => doc.widthOfString(t));
}

describe('a .woff font unpacked for pdfkit', () => {
  test('the fonts shipped for the certificates are all there (four weights of three subsets)', () => {
    expect(files).toHaveLength(12);
  });

  test.each(files)('%s: every table unpacks to the length and checksum its .woff declares', (file) => {
    const woff = readFileSync(join(FONT_DIR, file));
    const sfnt = sfntFromWoff(woff);
    const tables = sfntTables(sfnt);
    const directory = woffDirectory(woff);
    expect([...tables.keys()]).toEqual(directory.map((e) => e.tag));
    for (const e of directory) {
      const table = Buffer.from(tables.get(e.tag)!);
      // OpenType, 'head': its checksum is taken with checkSumAdjustment (bytes 8–11) set to 0.
      if (e.tag === 'head') table.fill(0, 8, 12);
      expect({ tag: e.tag, length: table.length, checksum: checksum(table) }).toEqual({
        tag: e.tag,
        length: e.origLength,
        checksum: e.origChecksum,
      });
    }
    // OpenType table directory: searchRange = 16 × the largest power of two ≤ numTables, and so on.
    const n = directory.length;
    const power = 2 ** Math.floor(Math.log2(n));
    expect([sfnt.readUInt16BE(6), sfnt.readUInt16BE(8), sfnt.readUInt16BE(10)]).toEqual([
      power * 16,
      Math.log2(power),
      n * 16 - power * 16,
    ]);
    // Each table starts on a four-byte boundary.
    for (let i = 0; i < n; i++) expect(sfnt.readUInt32BE(12 + i * 16 + 8) % 4).toBe(0);
  });

  test('the unpacked font measures text exactly as fontkit reading the .woff itself does', () => {
    // Text each subset covers (the certificates send every character to the subset that has it, a
    // space to Latin;
    // fontkit's .woff reader fails on a character its subset lacks, so none is measured here).
    const texts: Record<string, string[]> = {
      latin: ['Strip 12 · Left floor cable · 0.46 µF · near limit', 'Ærøskøbing Hall — 21 Nov'],
      'latin-ext': ['ŁĄĘŚŹŻłąęśźż', 'ŐŰőűĞŞğş'],
      greek: ['ΑΒΓΔαβγδ', 'ΩΩΩ'],
    };
    for (const file of files) {
      const subset = /ibm-plex-sans-(latin-ext|latin|greek)-/.exec(file)![1];
      const woff = readFileSync(join(FONT_DIR, file));
      const measured = widths(sfntFromWoff(woff), texts[subset]);
      expect(
        measured.every((w) => w > 20),
        file,
      ).toBe(true);
      expect(measured, file).toEqual(widths(woff, texts[subset]));
    }
  });

  test('a file that is not a .woff, or is cut short, is refused with the reason', () => {
    const woff = readFileSync(join(FONT_DIR, files[0]));
    expect(() => sfntFromWoff(Buffer.from('not a font at all, just some text here to be long enough'))).toThrow('no WOFF signature');
    expect(() => sfntFromWoff(woff.subarray(0, 60))).toThrow('table directory is cut short');
    expect(() => sfntFromWoff(woff.subarray(0, woff.length - 500))).toThrow(/outside the file/);
  });
});
