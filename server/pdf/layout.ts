// A small typesetter over pdfkit: IBM Plex Sans embedded from .woff (fontkit's subsetter fails on
// .woff2), unpacked once per process (woff.ts), font fallback across the Plex subsets (Ω lives in
// the Greek one), word wrapping, and tables that break across pages with their header repeated.
import PDFDocument from 'pdfkit';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { sfntFromWoff } from './woff';

const FONT_DIR = join(dirname(fileURLToPath(import.meta.url)), 'fonts');
export type Weight = 400 | 500 | 600 | 700;
const WEIGHTS: Weight[] = [400, 500, 600, 700];

// The subsets' unicode ranges, as published with the @fontsource/ibm-plex-sans files.
type Subset = 'latin' | 'latin-ext' | 'greek';
const RANGES: Record<Subset, [number, number][]> = {
  latin: [
    [0x0000, 0x00ff],
    [0x0131, 0x0131],
    [0x0152, 0x0153],
    [0x02bb, 0x02bc],
    [0x02c6, 0x02c6],
    [0x02da, 0x02da],
    [0x02dc, 0x02dc],
    [0x2000, 0x206f],
    [0x20ac, 0x20ac],
    [0x2122, 0x2122],
    [0x2212, 0x2212],
    [0x2215, 0x2215],
  ],
  'latin-ext': [
    [0x0100, 0x02ba],
    [0x02bd, 0x02c5],
    [0x02c7, 0x02cc],
    [0x02ce, 0x02d7],
    [0x02dd, 0x02ff],
    [0x1e00, 0x1e9f],
    [0x1ef2, 0x1eff],
    [0x2020, 0x2020],
    [0x20a0, 0x20ab],
    [0x20ad, 0x20c0],
    [0x2113, 0x2113],
  ],
  greek: [
    [0x0370, 0x0377],
    [0x037a, 0x037f],
    [0x0384, 0x038a],
    [0x038c, 0x038c],
    [0x038e, 0x03a1],
    [0x03a3, 0x03ff],
  ],
};
const SUBSETS: Subset[] = ['latin', 'latin-ext', 'greek'];
const fontName = (s: Subset, w: Weight) => `plex-${s}-${w}`;

const fontFiles = new Map<string, Buffer>();
/** The font's file, unpacked from its .woff the first time a document of this process needs it. */
function fontFile(subset: Subset, weight: Weight): Buffer {
  const name = fontName(subset, weight);
  let bytes = fontFiles.get(name);
  if (!bytes) fontFiles.set(name, (bytes = sfntFromWoff(readFileSync(join(FONT_DIR, `ibm-plex-sans-${subset}-${weight}-normal.woff`)))));
  return bytes;
}

function subsetOf(cp: number): Subset | null {
  for (const s of SUBSETS) if (RANGES[s].some(([a, b]) => cp >= a && cp <= b)) return s;
  return null;
}

export const COLOURS = {
  ink: '#17232a',
  soft: '#4a5a63',
  faint: '#7d8a91',
  line: '#d9d4c8',
  hairline: '#e7e3da',
  brand: '#0f3d3e',
  brandSoft: '#eaf2f0',
  pass: '#1f7a4d',
  near: '#9a6200',
  fail: '#b3261e',
};

export const A4 = { width: 595.28, height: 841.89 };

export interface TextStyle {
  size: number;
  weight?: Weight;
  color?: string;
  /** Extra space between letters, for small capitals labels. */
  tracking?: number;
}

interface Run {
  subset: Subset;
  text: string;
}

export function createDocument(info: { title: string; subject: string; keywords: string; creationDate: Date }) {
  const doc = new PDFDocument({
    size: 'A4',
    margin: 0,
    autoFirstPage: false,
    bufferPages: true,
    displayTitle: true,
    lang: 'en',
    info: {
      Title: info.title,
      Author: 'Stripwarden',
      Subject: info.subject,
      Keywords: info.keywords,
      Creator: 'Stripwarden',
      Producer: 'Stripwarden (pdfkit)',
      CreationDate: info.creationDate,
      ModDate: info.creationDate,
    },
  });
  for (const s of SUBSETS) for (const w of WEIGHTS) doc.registerFont(fontName(s, w), fontFile(s, w));
  return doc;
}

export function toBuffer(doc: PDFKit.PDFDocument): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.end();
  });
}

export class Pen {
  constructor(readonly doc: PDFKit.PDFDocument) {}

  private runs(text: string): Run[] {
    const out: Run[] = [];
    for (const ch of text) {
      const cp = ch.codePointAt(0)!;
      const subset = subsetOf(cp);
      const glyph = subset ? ch : '?';
      const s = subset ?? 'latin';
      const last = out[out.length - 1];
      if (last && last.subset === s) last.text += glyph;
      else out.push({ subset: s, text: glyph });
    }
    return out;
  }

  width(text: string, style: TextStyle): number {
    let w = 0;
    for (const r of this.runs(text)) {
      this.doc.font(fontName(r.subset, style.weight ?? 400)).fontSize(style.size);
      w += this.doc.widthOfString(r.text, { characterSpacing: style.tracking ?? 0 });
    }
    return w;
  }

  lineHeight(style: TextStyle, leading = 1.35) {
    return style.size * leading;
  }

  /** One line at (x, y), top of the line box; right or centre aligned within `width` if given. */
  line(text: string, x: number, y: number, style: TextStyle, opts: { width?: number; align?: 'left' | 'right' | 'center' } = {}) {
    let shown = text;
    if (opts.width !== undefined && this.width(shown, style) > opts.width) {
      while (shown.length > 1 && this.width(`${shown}…`, style) > opts.width) shown = shown.slice(0, -1);
      shown = `${shown.trimEnd()}…`;
    }
    const w = this.width(shown, style);
    let cx = x;
    if (opts.width !== undefined && opts.align === 'right') cx = x + opts.width - w;
    if (opts.width !== undefined && opts.align === 'center') cx = x + (opts.width - w) / 2;
    this.doc.fillColor(style.color ?? COLOURS.ink);
    for (const r of this.runs(shown)) {
      this.doc.font(fontName(r.subset, style.weight ?? 400)).fontSize(style.size);
      this.doc.text(r.text, cx, y, { lineBreak: false, characterSpacing: style.tracking ?? 0 });
      cx += this.doc.widthOfString(r.text, { characterSpacing: style.tracking ?? 0 });
    }
    return w;
  }

  /** Breaks text into lines no wider than `width`; words longer than a line are cut. */
  wrap(text: string, width: number, style: TextStyle): string[] {
    const lines: string[] = [];
    for (const para of text.split('\n')) {
      let current = '';
      for (const word of para.split(/\s+/).filter(Boolean)) {
        const candidate = current ? `${current} ${word}` : word;
        if (this.width(candidate, style) <= width) {
          current = candidate;
          continue;
        }
        if (current) lines.push(current);
        let rest = word;
        while (this.width(rest, style) > width) {
          let cut = rest.length - 1;
          while (cut > 1 && this.width(rest.slice(0, cut), style) > width) cut -= 1;
          lines.push(rest.slice(0, cut));
          rest = rest.slice(cut);
        }
        current = rest;
      }
      lines.push(current);
    }
    return lines;
  }

  /** A wrapped paragraph; returns its height. */
  paragraph(text: string, x: number, y: number, width: number, style: TextStyle, leading = 1.4): number {
    const lines = this.wrap(text, width, style);
    const lh = style.size * leading;
    lines.forEach((l, i) => this.line(l, x, y + i * lh, style));
    return lines.length * lh;
  }

  rule(x1: number, x2: number, y: number, color = COLOURS.line, width = 0.5) {
    this.doc.save().moveTo(x1, y).lineTo(x2, y).lineWidth(width).strokeColor(color).stroke().restore();
  }

  box(x: number, y: number, w: number, h: number, fill: string) {
    this.doc.save().rect(x, y, w, h).fill(fill).restore();
  }
}

export interface Column<R> {
  header: string;
  width: number;
  align?: 'left' | 'right';
  /** Cells wrap by default; a nowrap cell is cut with an ellipsis. */
  nowrap?: boolean;
  value: (row: R) => string;
  style?: (row: R) => Partial<TextStyle>;
  /** Draws something before the text (a verdict shape); returns the width it used. */
  mark?: (row: R, pen: Pen, x: number, y: number, size: number) => number;
}

export interface Frame {
  left: number;
  right: number;
  top: number;
  bottom: number;
}

/**
 * Draws a table from y, breaking across pages: `newPage` adds a page and returns the y to go on
 * from, the header row is repeated on every page. Returns the y below the table.
 */
export function table<R>(
  pen: Pen,
  rows: R[],
  columns: Column<R>[],
  y: number,
  frame: Frame,
  newPage: () => number,
  opts: { size?: number; headerSize?: number; padY?: number; zebra?: boolean } = {},
): number {
  const size = opts.size ?? 8;
  const headerSize = opts.headerSize ?? 7;
  const padY = opts.padY ?? 3.2;
  const padX = 4;
  const lh = size * 1.3;
  const totalWidth = columns.reduce((s, c) => s + c.width, 0);
  const scale = (frame.right - frame.left) / totalWidth;
  const widths = columns.map((c) => c.width * scale);
  const xs = widths.map((_, i) => frame.left + widths.slice(0, i).reduce((s, w) => s + w, 0));
  const headerStyle: TextStyle = { size: headerSize, weight: 600, color: COLOURS.soft, tracking: 0.3 };

  const header = (at: number) => {
    const hLines = columns.map((c, i) => pen.wrap(c.header.toUpperCase(), widths[i] - 2 * padX, headerStyle));
    const h = Math.max(...hLines.map((l) => l.length)) * headerSize * 1.25 + 2 * padY;
    columns.forEach((c, i) =>
      hLines[i].forEach((l, k) =>
        pen.line(l, xs[i] + padX, at + padY + k * headerSize * 1.25, headerStyle, { width: widths[i] - 2 * padX, align: c.align }),
      ),
    );
    pen.rule(frame.left, frame.right, at + h, COLOURS.brand, 0.8);
    return at + h;
  };

  let cy = header(y);
  rows.forEach((row, ri) => {
    const cells = columns.map((c, i) => {
      const style: TextStyle = { size, weight: 400, color: COLOURS.ink, ...c.style?.(row) };
      const markW = c.mark ? size * 1.1 : 0;
      const text = c.value(row);
      const lines = c.nowrap ? [text] : pen.wrap(text, widths[i] - 2 * padX - markW, style);
      return { style, lines, markW };
    });
    const h = Math.max(...cells.map((c) => c.lines.length)) * lh + 2 * padY;
    if (cy + h > frame.bottom) cy = header(newPage());
    if (opts.zebra && ri % 2 === 1) pen.box(frame.left, cy, frame.right - frame.left, h, '#f7f6f2');
    columns.forEach((c, i) => {
      const cell = cells[i];
      let x = xs[i] + padX;
      if (c.mark) {
        c.mark(row, pen, x, cy + padY + size * 0.12, size);
        x += cell.markW;
      }
      cell.lines.forEach((l, k) =>
        pen.line(l, x, cy + padY + k * lh, cell.style, { width: widths[i] - 2 * padX - cell.markW, align: c.align }),
      );
    });
    cy += h;
    pen.rule(frame.left, frame.right, cy, COLOURS.hairline, 0.4);
  });
  return cy;
}
