// The pages of a certificate: the frame, the running header and footer, and the blocks a venue or
// strip certificate is made of (facts, rule lists, the scope sentence, the signature with its QR
// code); and the words and marks readings are shown with.
import QRCode from 'qrcode';
import { createHash } from 'node:crypto';
import { A4, COLOURS, Pen, table, type Column, type Frame, type TextStyle } from './layout';
import type { CertificatePayload, CertifiedReading } from '../signing/certificate-record';
import { formatOhm } from '../../shared/domain/units';
import { TEST_KIND_LABELS } from '../../shared/domain/checklist';
import { READING_SYMBOLS } from '../../shared/domain/symbols';
import { drawSymbol } from './symbol-mark';
import {
  formatCalendarRange,
  formatCompactDateTime,
  formatDate,
  formatDateTimeWithOffset,
  formatTime,
  SERVER_LOCALE,
  utcOffsetLabel,
} from '../../shared/format/date-time';

export const MARGIN_X = 56;
export type Orientation = 'portrait' | 'landscape';
export const frameFor = (o: Orientation): Frame => {
  const [w, h] = o === 'portrait' ? [A4.width, A4.height] : [A4.height, A4.width];
  return { left: MARGIN_X, right: w - MARGIN_X, top: 78, bottom: h - 62 };
};

/**
 * The venue's clock, as every time in the document is written (shared/format/date-time): the
 * zone is fixed at rendering, so the same record and zone always give the same bytes.
 */
export interface Clock {
  timeZone: string;
  /** "21 Nov 2026, 07:40 (UTC+01:00)" */
  dateTime(iso: string): string;
  /** "21 Nov, 07:40", for table cells under a header that gives the offset. */
  short(iso: string): string;
  day(iso: string): string;
  time(iso: string): string;
  /** The zone's offset when the venue was signed off ("UTC+01:00"), for the column headers. */
  offset: string;
}
export function clockFor(timeZone: string, signedAt: string): Clock {
  const ctx = { timeZone, locale: SERVER_LOCALE };
  return {
    timeZone,
    dateTime: (iso) => formatDateTimeWithOffset(iso, ctx),
    short: (iso) => formatCompactDateTime(iso, ctx),
    day: (iso) => formatDate(iso, ctx),
    time: (iso) => formatTime(iso, ctx),
    offset: utcOffsetLabel(signedAt, timeZone),
  };
}
/** The event's days (calendar days: no zone). */
export const formatDateRange = (startsOn: string, endsOn: string) => formatCalendarRange(startsOn, endsOn, { locale: SERVER_LOCALE });

export const limitText = (r: CertifiedReading) =>
  r.limitOhm === null ? '—' : `${r.limitKind === 'min' ? 'min' : 'max'} ${formatOhm(r.limitOhm)}`;
export const testLabel = (kind: string) => TEST_KIND_LABELS[kind as keyof typeof TEST_KIND_LABELS] ?? kind;
export const verdictLabel = (v: CertifiedReading['verdict']) => READING_SYMBOLS[v].label;
export const ruleLabel = (id: string) => {
  const [kind, test] = id.split('.');
  const k = kind.replace(/-/g, ' ');
  return `${k.charAt(0).toUpperCase()}${k.slice(1)}, ${testLabel(test === 'end-to-end' ? 'piste-end-to-end' : test === 'earth' ? 'piste-earth' : test).toLowerCase()}`;
};
export const verdictColour = (v: CertifiedReading['verdict']) =>
  v === 'pass' ? COLOURS.pass : v === 'near-limit' ? COLOURS.near : COLOURS.fail;
export const fingerprint = (jws: string) => createHash('sha256').update(jws).digest('hex').toUpperCase().match(/.{4}/g)!.join(' ');

/** The verdict's shape from the one symbol module (fail ▲, near limit ◆, pass ●), drawn as vectors. */
export function verdictMark(pen: Pen, verdict: CertifiedReading['verdict'], x: number, y: number, size: number) {
  return drawSymbol(pen.doc, READING_SYMBOLS[verdict], x, y, size * 0.78, verdictColour(verdict));
}

export function drawQr(pen: Pen, text: string, x: number, y: number, size: number) {
  const qr = QRCode.create(text, { errorCorrectionLevel: 'M' });
  const n = qr.modules.size;
  const quiet = 2;
  const cell = size / (n + 2 * quiet);
  const doc = pen.doc.save();
  doc.rect(x, y, size, size).fill('#ffffff');
  for (let r = 0; r < n; r++)
    for (let c = 0; c < n; c++)
      if (qr.modules.get(r, c)) doc.rect(x + (c + quiet) * cell, y + (r + quiet) * cell, cell + 0.02, cell + 0.02);
  doc.fill(COLOURS.ink);
  doc.restore();
}

export class Writer {
  readonly pen: Pen;
  private orientation: Orientation = 'portrait';
  frame = frameFor('portrait');
  y = this.frame.top;
  get width() {
    return this.frame.right - this.frame.left;
  }
  constructor(
    readonly doc: PDFKit.PDFDocument,
    readonly p: CertificatePayload,
    private readonly runningTitle: string,
    readonly clock: Clock,
  ) {
    this.pen = new Pen(doc);
  }

  newPage(orientation: Orientation = this.orientation) {
    this.orientation = orientation;
    this.frame = frameFor(orientation);
    this.doc.addPage({ size: 'A4', layout: orientation, margin: 0 });
    this.header();
    this.y = this.frame.top;
    return this.y;
  }

  /** A new page when less than `h` is left. */
  need(h: number) {
    if (this.y + h > this.frame.bottom) this.newPage();
  }

  private header() {
    const { pen, frame: FRAME, width: WIDTH } = this;
    const y = 34;
    pen.doc.save().roundedRect(FRAME.left, y, 14, 14, 2.5).fill(COLOURS.brand).restore();
    pen.doc
      .save()
      .moveTo(FRAME.left + 2.6, y + 10.2)
      .lineTo(FRAME.left + 11.4, y + 10.2)
      .moveTo(FRAME.left + 4, y + 4)
      .lineTo(FRAME.left + 10, y + 10.2)
      .moveTo(FRAME.left + 10, y + 4)
      .lineTo(FRAME.left + 4, y + 10.2)
      .lineWidth(1.1)
      .lineCap('round')
      .strokeColor('#ffffff')
      .stroke()
      .restore();
    pen.line('STRIPWARDEN', FRAME.left + 21, y + 2.6, { size: 8, weight: 600, color: COLOURS.brand, tracking: 1.6 });
    pen.line(this.runningTitle, FRAME.left, y + 2.6, { size: 7.5, color: COLOURS.soft }, { width: WIDTH, align: 'right' });
    pen.rule(FRAME.left, FRAME.right, y + 22, COLOURS.line, 0.5);
  }

  footers() {
    const range = this.doc.bufferedPageRange();
    for (let i = 0; i < range.count; i++) {
      this.doc.switchToPage(range.start + i);
      const FRAME = { left: MARGIN_X, right: this.doc.page.width - MARGIN_X };
      const WIDTH = FRAME.right - FRAME.left;
      const y = this.doc.page.height - 46;
      this.pen.rule(FRAME.left, FRAME.right, y, COLOURS.line, 0.5);
      const style: TextStyle = { size: 7, color: COLOURS.soft };
      this.pen.line(`Certificate ${this.p.number} · verify at ${this.p.verifyUrl}`, FRAME.left, y + 8, style, { width: WIDTH - 80 });
      this.pen.line(`Page ${i + 1} of ${range.count}`, FRAME.left, y + 8, style, { width: WIDTH, align: 'right' });
    }
  }

  eyebrow(text: string) {
    const { frame: FRAME } = this;
    this.pen.line(text.toUpperCase(), FRAME.left, this.y, { size: 7.5, weight: 600, color: COLOURS.brand, tracking: 1.1 });
    this.y += 14;
  }

  title(text: string, subtitle: string) {
    const { frame: FRAME, width: WIDTH } = this;
    const numberW = 150;
    const lines = this.pen.wrap(text, WIDTH - numberW - 12, { size: 24, weight: 600 });
    lines.forEach((l, i) => this.pen.line(l, FRAME.left, this.y + i * 29, { size: 24, weight: 600 }));
    // The number, top right, where a reader looks for it.
    const nx = FRAME.right - numberW;
    this.pen.line(
      'CERTIFICATE NO.',
      nx,
      this.y - 12,
      { size: 6.5, weight: 600, color: COLOURS.soft, tracking: 0.8 },
      { width: numberW, align: 'right' },
    );
    this.pen.line(this.p.number, nx, this.y - 1, { size: 11.5, weight: 600, color: COLOURS.brand }, { width: numberW, align: 'right' });
    this.y += lines.length * 29 + 2;
    this.y += this.pen.paragraph(subtitle, FRAME.left, this.y, WIDTH, { size: 10.5, color: COLOURS.soft });
    this.y += 10;
  }

  text(text: string, style: TextStyle = { size: 9.5 }, gap = 10) {
    const { frame: FRAME, width: WIDTH } = this;
    const h = this.pen.wrap(text, WIDTH, style).length * style.size * 1.4;
    this.need(h);
    this.y += this.pen.paragraph(text, FRAME.left, this.y, WIDTH, style) + gap;
  }

  section(title: string, minBelow = 60) {
    const { frame: FRAME } = this;
    this.need(26 + minBelow);
    this.y += 6;
    this.pen.line(title, FRAME.left, this.y, { size: 10.5, weight: 600, color: COLOURS.ink });
    this.y += 16;
    this.pen.rule(FRAME.left, FRAME.right, this.y, COLOURS.line, 0.5);
    this.y += 7;
  }

  /** Label over value, in a grid of `cols` columns. */
  facts(items: [string, string][], cols = 3) {
    const { frame: FRAME, width: WIDTH } = this;
    const gap = 14;
    const w = (WIDTH - gap * (cols - 1)) / cols;
    for (let i = 0; i < items.length; i += cols) {
      const row = items.slice(i, i + cols);
      const valueStyle: TextStyle = { size: 9, weight: 500 };
      const heights = row.map(([, v]) => this.pen.wrap(v, w, valueStyle).length * 9 * 1.35);
      const h = 10 + Math.max(...heights) + 6;
      this.need(h);
      row.forEach(([label, value], k) => {
        const x = FRAME.left + k * (w + gap);
        this.pen.line(label.toUpperCase(), x, this.y, { size: 6.5, weight: 600, color: COLOURS.soft, tracking: 0.7 });
        this.pen.paragraph(value, x, this.y + 10, w, valueStyle, 1.35);
      });
      this.y += h;
    }
  }

  /** Two columns of label and text pairs, compact: the strip certificate's limits. */
  ruleList(items: [string, string][]) {
    const { frame: FRAME, width: WIDTH } = this;
    const gap = 18;
    const w = (WIDTH - gap) / 2;
    const label: TextStyle = { size: 7, weight: 600 };
    const text: TextStyle = { size: 6.8, color: COLOURS.soft };
    for (let i = 0; i < items.length; i += 2) {
      const pair = items.slice(i, i + 2);
      const h = Math.max(...pair.map(([, t]) => this.pen.wrap(t, w, text).length)) * 6.8 * 1.3 + 9 + 5;
      this.need(h);
      pair.forEach(([l, t], k) => {
        const x = FRAME.left + k * (w + gap);
        this.pen.line(l, x, this.y, label, { width: w });
        this.pen.paragraph(t, x, this.y + 9, w, text, 1.3);
      });
      this.y += h;
    }
    this.y += 4;
  }

  table<R>(rows: R[], columns: Column<R>[], opts?: Parameters<typeof table>[6]) {
    this.need(40);
    this.y = table(this.pen, rows, columns, this.y, this.frame, () => this.newPage(), opts) + 10;
  }

  scope() {
    const { frame: FRAME, width: WIDTH } = this;
    const style: TextStyle = { size: 8.5, color: COLOURS.ink };
    const lines = this.pen.wrap(this.p.scope, WIDTH - 28, style);
    const h = 14 + 12 + lines.length * 8.5 * 1.4 + 8;
    this.need(h + 6);
    this.pen.box(FRAME.left, this.y, WIDTH, h, COLOURS.brandSoft);
    this.pen.box(FRAME.left, this.y, 2.5, h, COLOURS.brand);
    this.pen.line('SCOPE', FRAME.left + 14, this.y + 9, { size: 6.5, weight: 600, color: COLOURS.brand, tracking: 0.8 });
    this.pen.paragraph(this.p.scope, FRAME.left + 14, this.y + 21, WIDTH - 28, style);
    this.y += h + 12;
  }

  /** The signature in plain words, with the code to scan; the technical details go to signatureAnnex(). */
  signature(annexName: string) {
    const { frame: FRAME, width: WIDTH } = this;
    const qr = 86;
    const h = qr + 24;
    this.need(h);
    const top = this.y;
    const left = FRAME.left;
    const textW = WIDTH - qr - 12;
    this.pen.line('SIGNED ELECTRONICALLY', left, top, { size: 6.5, weight: 600, color: COLOURS.soft, tracking: 0.8 });
    this.pen.line(this.p.signer.name, left, top + 11, { size: 13, weight: 600 });
    this.pen.line(`${this.p.signer.role}, ${this.clock.dateTime(this.p.signedAt)}`, left, top + 29, { size: 9, color: COLOURS.soft });
    const plain: TextStyle = { size: 8.5, color: COLOURS.ink };
    const words = `${this.p.issuer.organisation.name} signed this certificate with its own digital key when the venue was signed off. To check that it is genuine, unaltered and still valid, scan the code or open ${this.p.verifyUrl}. Any change to the file or its record shows there. The technical details are in ${annexName}.`;
    let y = top + 46;
    for (const l of this.pen.wrap(words, textW, plain)) {
      this.pen.line(l, left, y, plain);
      y += 11;
    }
    const qx = FRAME.right - qr;
    drawQr(this.pen, this.p.verifyUrl, qx, top - 2, qr);
    this.pen.line(
      'Scan to check this certificate',
      qx - 20,
      top + qr + 2,
      { size: 6.5, color: COLOURS.soft },
      { width: qr + 20, align: 'right' },
    );
    this.y = Math.max(y, top + qr + 14) + 6;
  }

  /** The signature's technical details, for whoever checks it by hand. */
  signatureAnnex(title: string, jws: string, keyId: string) {
    const { frame: FRAME, width: WIDTH } = this;
    this.need(120);
    this.y += 14;
    this.eyebrow(title);
    this.pen.line('Signature details', FRAME.left, this.y, { size: 16, weight: 600 });
    this.y += 25;
    const mono: TextStyle = { size: 7.5, color: COLOURS.soft };
    const rows: [string, string][] = [
      ['Algorithm', 'Ed25519, compact JWS (RFC 7515, RFC 8037) over the RFC 8785 canonical record'],
      ['Key id', keyId],
      ['JWS SHA-256', fingerprint(jws)],
      ['Full signature', `${this.p.issuer.origin}/api/verify/${this.p.number}`],
      ['Public keys', `${this.p.issuer.origin}/.well-known/jwks.json`],
    ];
    for (const [label, value] of rows) {
      const lines = this.pen.wrap(value, WIDTH - 80, mono);
      this.need(lines.length * 10 + 2);
      this.pen.line(label, FRAME.left, this.y, { size: 7.5, weight: 600, color: COLOURS.ink });
      lines.forEach((l, i) => this.pen.line(l, FRAME.left + 80, this.y + i * 10, mono));
      this.y += lines.length * 10 + 3;
    }
  }
}
