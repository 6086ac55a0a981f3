// The certificates as PDF: a venue certificate (summary, then an annex with every reading) and a
// one-page certificate per strip. Rendered only from the signed record and the certified readings,
// with the signing time as the document date, so the same record always gives the same bytes.
import QRCode from 'qrcode';
import { createHash } from 'node:crypto';
import { A4, COLOURS, createDocument, Pen, table, toBuffer, type Column, type Frame, type TextStyle } from './layout';
import type { CertificatePayload, CertifiedReading, DismissedFault } from '../signing/certificate-record';
import { formatOhm } from '../../shared/domain/units';
import { stepsForKind, TEST_KIND_LABELS } from '../../shared/domain/checklist';
import type { TestKind } from '../../shared/domain/limits';
import { legendText, READING_SYMBOLS } from '../../shared/domain/symbols';
import { drawSymbol } from './symbol-mark';

export interface CertificateDocument {
  payload: CertificatePayload;
  jws: string;
  keyId: string;
  /** Venue: all certified readings; strip: that strip's. */
  readings: CertifiedReading[];
}

const MARGIN_X = 56;
type Orientation = 'portrait' | 'landscape';
const frameFor = (o: Orientation): Frame => {
  const [w, h] = o === 'portrait' ? [A4.width, A4.height] : [A4.height, A4.width];
  return { left: MARGIN_X, right: w - MARGIN_X, top: 78, bottom: h - 62 };
};

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];
const pad = (n: number) => String(n).padStart(2, '0');
/** UTC, spelled out, so the document reads the same wherever it is rendered. */
export function formatUtc(iso: string): string {
  const d = new Date(iso);
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()].slice(0, 3)} ${d.getUTCFullYear()}, ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())} UTC`;
}
const timeUtc = (iso: string) => {
  const d = new Date(iso);
  return `${pad(d.getUTCDate())}/${pad(d.getUTCMonth() + 1)} ${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}`;
};
export function formatDateRange(startsOn: string, endsOn: string): string {
  const [a, b] = [new Date(`${startsOn}T00:00:00Z`), new Date(`${endsOn}T00:00:00Z`)];
  const month = (d: Date) => MONTHS[d.getUTCMonth()];
  if (startsOn === endsOn) return `${a.getUTCDate()} ${month(a)} ${a.getUTCFullYear()}`;
  if (a.getUTCFullYear() === b.getUTCFullYear() && a.getUTCMonth() === b.getUTCMonth())
    return `${a.getUTCDate()}–${b.getUTCDate()} ${month(b)} ${b.getUTCFullYear()}`;
  return `${a.getUTCDate()} ${month(a)} ${a.getUTCFullYear()} – ${b.getUTCDate()} ${month(b)} ${b.getUTCFullYear()}`;
}

const limitText = (r: CertifiedReading) =>
  r.limitOhm === null ? '—' : `${r.limitKind === 'min' ? 'min' : 'max'} ${formatOhm(r.limitOhm)}`;
const testLabel = (kind: string) => TEST_KIND_LABELS[kind as keyof typeof TEST_KIND_LABELS] ?? kind;
const verdictLabel = (v: CertifiedReading['verdict']) => READING_SYMBOLS[v].label;
const ruleLabel = (id: string) => {
  const [kind, test] = id.split('.');
  const k = kind.replace(/-/g, ' ');
  return `${k.charAt(0).toUpperCase()}${k.slice(1)}, ${testLabel(test === 'end-to-end' ? 'piste-end-to-end' : test === 'earth' ? 'piste-earth' : test).toLowerCase()}`;
};
const fingerprint = (jws: string) =>
  createHash('sha256').update(jws).digest('hex').toUpperCase().match(/.{4}/g)!.join(' ');

/** The verdict's shape from the one symbol module (fail ▲, near limit ◆, pass ●), drawn as vectors. */
function verdictMark(pen: Pen, verdict: CertifiedReading['verdict'], x: number, y: number, size: number) {
  return drawSymbol(pen.doc, READING_SYMBOLS[verdict], x, y, size * 0.78, verdictColour(verdict));
}

function drawQr(pen: Pen, text: string, x: number, y: number, size: number) {
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

class Writer {
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
      .moveTo(FRAME.left + 2.6, y + 10.2).lineTo(FRAME.left + 11.4, y + 10.2)
      .moveTo(FRAME.left + 4, y + 4).lineTo(FRAME.left + 10, y + 10.2)
      .moveTo(FRAME.left + 10, y + 4).lineTo(FRAME.left + 4, y + 10.2)
      .lineWidth(1.1).lineCap('round').strokeColor('#ffffff').stroke().restore();
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
    this.pen.line('CERTIFICATE NO.', nx, this.y - 12, { size: 6.5, weight: 600, color: COLOURS.soft, tracking: 0.8 }, { width: numberW, align: 'right' });
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
    this.pen.line(`${this.p.signer.role}, ${formatUtc(this.p.signedAt)}`, left, top + 29, { size: 9, color: COLOURS.soft });
    const plain: TextStyle = { size: 8.5, color: COLOURS.ink };
    const words = `${this.p.issuer.organisation.name} signed this certificate with its own digital key when the venue was signed off. To check that it is genuine, unaltered and still valid, scan the code or open ${this.p.verifyUrl}. Any change to the file or its record shows there. The technical details are in ${annexName}.`;
    let y = top + 46;
    for (const l of this.pen.wrap(words, textW, plain)) {
      this.pen.line(l, left, y, plain);
      y += 11;
    }
    const qx = FRAME.right - qr;
    drawQr(this.pen, this.p.verifyUrl, qx, top - 2, qr);
    this.pen.line('Scan to check this certificate', qx - 20, top + qr + 2, { size: 6.5, color: COLOURS.soft }, { width: qr + 20, align: 'right' });
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

const shortSource = (source: string) =>
  source.replace(/^FIE Material Rules, art\. /, 'FIE art. ').replace(/^House rule \(no published value\)$/, 'House rule');
const valueText = (r: CertifiedReading) => (r.overRange ? 'OL' : r.valueOhm === null ? r.valueText : formatOhm(r.valueOhm));
/** The test-lead null subtracted from what the meter showed, or a dash. */
const leadNullText = (r: CertifiedReading) => (r.overRange || !r.leadNullOhm ? '—' : `− ${formatOhm(r.leadNullOhm)}`);
const FAULT_KIND: Record<string, string> = { short: 'Short', open: 'Open line', 'high-resistance': 'High resistance', intermittent: 'Intermittent' };
const verdictColour = (v: CertifiedReading['verdict']) => (v === 'pass' ? COLOURS.pass : v === 'near-limit' ? COLOURS.near : COLOURS.fail);

function readingColumns(): Column<CertifiedReading>[] {
  return [
    { header: 'Strip', width: 52, value: (r) => r.stripLabel, style: () => ({ weight: 500 }) },
    { header: 'Position', width: 74, value: (r) => r.position },
    { header: 'Asset tag', width: 50, value: (r) => r.assetTag ?? '—', nowrap: true },
    { header: 'Test', width: 76, value: (r) => testLabel(r.testKind) },
    { header: 'Wires', width: 40, value: (r) => (r.conductors.startsWith('piste') ? '—' : r.conductors), nowrap: true },
    { header: 'Value', width: 48, align: 'right', value: valueText, nowrap: true, style: () => ({ weight: 500 }) },
    { header: 'Lead null', width: 42, align: 'right', value: leadNullText, nowrap: true, style: () => ({ color: COLOURS.soft }) },
    { header: 'Limit', width: 62, value: limitText, nowrap: true },
    {
      header: 'Verdict',
      width: 60,
      value: (r) => verdictLabel(r.verdict),
      nowrap: true,
      style: (r) => ({ color: verdictColour(r.verdict), weight: 500 }),
      mark: (r, pen, x, y, size) => verdictMark(pen, r.verdict, x, y, size),
    },
    { header: 'Source', width: 84, value: (r) => shortSource(r.source), nowrap: true },
    { header: 'Tester', width: 70, value: (r) => r.takenBy },
    { header: 'Taken (UTC)', width: 62, value: (r) => timeUtc(r.takenAt), nowrap: true },
  ];
}

function testedLine(p: CertificatePayload) {
  const [a, b] = [formatUtc(p.testedFrom), formatUtc(p.testedTo)];
  if (a.slice(0, -10) === b.slice(0, -10)) return `${a.slice(0, -4)}–${b.slice(-9)}`;
  return `${a} to ${b}`;
}

function commonFacts(p: CertificatePayload): [string, string][] {
  return [
    ['Limit profile', `${p.profile.name}, version ${p.profile.version}`],
    ...(p.profile.temperature ? ([['Temperature', p.profile.temperature]] as [string, string][]) : []),
    ['Tested by', p.testedBy.map((t) => t.name).join(', ') || '—'],
    ['Testing', testedLine(p)],
    ['Signed by', `${p.signer.name}, ${p.signer.role}`],
    ['Signed', formatUtc(p.signedAt)],
  ];
}

function limitsTable(w: Writer, rules: CertificatePayload['profile']['rules'], size = 7.5, withNotes = false, padY = 2.4) {
  type Rule = CertificatePayload['profile']['rules'][number];
  const columns: Column<Rule>[] = [
    { header: 'Equipment and test', width: 130, value: (r) => ruleLabel(r.id), style: () => ({ weight: 500 }) },
    { header: 'Limit', width: 150, value: (r) => r.limit },
    { header: 'Source', width: 170, value: (r) => r.source },
  ];
  if (withNotes) columns.push({ header: 'Note', width: 330, value: (r) => r.note ?? '', style: () => ({ color: COLOURS.soft }) });
  w.table(rules, columns, { size, headerSize: 6, padY });
}

/** The test-lead nulls the readings used: who measured each, when, with which meter. */
function leadNullsTable(w: Writer, p: CertificatePayload) {
  type Row = CertificatePayload['leadNulls'][number];
  if (p.leadNulls.length === 0) {
    w.text('No test-lead null was subtracted from these readings.', { size: 8.5, color: COLOURS.soft }, 8);
    return;
  }
  w.table<Row>(p.leadNulls, [
    { header: 'Measured by', width: 120, value: (n) => n.takenBy, style: () => ({ weight: 500 }) },
    { header: 'When (UTC)', width: 90, value: (n) => timeUtc(n.takenAt), nowrap: true },
    { header: 'Leads read', width: 60, align: 'right', value: (n) => formatOhm(n.valueOhm), nowrap: true },
    { header: 'Meter', width: 140, value: (n) => n.meter ?? '—' },
    { header: 'Readings using it', width: 70, align: 'right', value: (n) => String(n.readings) },
  ], { size: 7.5, headerSize: 6, padY: 2.6 });
}

/** Faults the director closed as typing mistakes, each with the reason given. */
function dismissedTable(w: Writer, faults: DismissedFault[], withStrip = true) {
  if (faults.length === 0) {
    w.text('None: every fault on these strips was closed by a repair and a passing retest.', { size: 8.5, color: COLOURS.soft }, 8);
    return;
  }
  const columns: Column<DismissedFault>[] = [
    { header: 'Position', width: 80, value: (f) => f.position },
    { header: 'Fault', width: 90, value: (f) => `${FAULT_KIND[f.kind] ?? f.kind} ${f.conductors.startsWith('piste') ? '' : f.conductors}`.trim() },
    { header: 'Opened (UTC)', width: 62, value: (f) => timeUtc(f.openedAt) },
    { header: 'Dismissed by', width: 90, value: (f) => `${f.dismissedBy}, ${timeUtc(f.dismissedAt)}` },
    { header: 'Reason', width: withStrip ? 300 : 220, value: (f) => f.reason },
  ];
  if (withStrip) columns.unshift({ header: 'Strip', width: 52, value: (f) => f.stripLabel, style: () => ({ weight: 500 }) });
  w.table(faults, columns, { size: 7.5, headerSize: 6, padY: 2.6 });
}

function renderVenue(w: Writer, doc: CertificateDocument) {
  const { payload: p } = doc;
  w.newPage('portrait');
  w.eyebrow('Venue certificate · electrical testing of competition equipment');
  w.title(p.venue.name, `${p.event.name} · ${formatDateRange(p.event.startsOn, p.event.endsOn)} · ${p.issuer.organisation.name}`);
  const certified = p.strips.length;
  const total = certified + p.exceptions.length;
  w.text(
    `This certifies that the competition equipment of the ${certified === 1 ? 'strip' : `${certified} strips`} listed below was tested strip by strip, and that the latest reading of every required test was within the limits of the profile named here when the venue was signed off. The limits and their sources are in Annex A, every reading in Annex B, the test-lead nulls and any fault dismissed as a typing mistake in Annex C.`,
    { size: 9.5 },
    12,
  );
  w.facts([
    ['Event', p.event.name],
    ['Dates', formatDateRange(p.event.startsOn, p.event.endsOn)],
    ['Venue', p.venue.name],
    ['Strips certified', `${certified} of ${total}`],
    ['Items tested', String(p.items.length)],
    ['Readings', `${p.readings.count}${p.readings.nearLimit ? `, ${p.readings.nearLimit} near limit` : ', none near limit'}`],
    ...commonFacts(p),
    ['Organisation', p.issuer.organisation.name],
  ]);

  w.section('Strips certified');
  const stripNo = new Map(p.related.stripCertificates.map((s) => [s.stripId, s.number]));
  w.table(p.strips, [
    { header: 'Strip', width: 58, value: (s) => s.label, style: () => ({ weight: 500 }) },
    { header: 'Zone', width: 46, value: (s) => s.zone ?? '—' },
    { header: 'Items by asset tag', width: 150, value: (s) => s.items.map((i) => i.assetTag ?? i.position).join(', ') },
    { header: 'Readings', width: 46, align: 'right', value: (s) => String(s.readings) },
    { header: 'Near limit', width: 46, align: 'right', value: (s) => String(s.nearLimit) },
    { header: 'Strip certificate', width: 104, value: (s) => stripNo.get(s.id) ?? '—', nowrap: true },
  ]);

  w.section('Left out of this certificate', 20);
  if (p.exceptions.length === 0) w.text('None: every strip of the venue is certified.', { size: 9, color: COLOURS.soft });
  else
    w.table(p.exceptions, [
      { header: 'Strip', width: 60, value: (e) => e.label, style: () => ({ weight: 500 }) },
      { header: 'Reason', width: 300, value: (e) => e.reason },
      { header: 'Recorded', width: 90, value: (e) => (e.source === 'withdrawn' ? 'Withdrawn before sign-off' : 'At sign-off') },
    ]);

  w.section('Statement of the technical director', 30);
  w.text(`“${p.statement}”`, { size: 9.5, color: COLOURS.ink }, 12);
  w.scope();
  w.signature('Annex D');

  // The annexes are landscape, so each rule and each reading fits on a line.
  w.newPage('landscape');
  w.eyebrow('Annex A');
  w.pen.line('Limits applied and their sources', w.frame.left, w.y, { size: 16, weight: 600 });
  w.y += 25;
  w.text(
    `Limit profile “${p.profile.name}”, version ${p.profile.version}. Each reading was judged against the rule for its equipment and test. A house rule is the organisation's own choice where the FIE Material Rules give no number.`,
    { size: 8.5, color: COLOURS.soft },
    8,
  );
  limitsTable(w, p.profile.rules, 7.5, true);

  w.need(120);
  w.y += 14;
  w.eyebrow('Annex B');
  w.pen.line('Readings', w.frame.left, w.y, { size: 16, weight: 600 });
  w.y += 25;
  w.text(
    `The latest reading of every required test on the certified strips, as signed: ${p.readings.count} readings. Values are in ohms after the tester's test-lead null (the Lead null column, recorded in Annex C) was subtracted from what the meter showed. SHA-256 of the list in canonical JSON (RFC 8785): ${p.readings.digest}.`,
    { size: 8, color: COLOURS.soft },
    8,
  );
  w.table(doc.readings, readingColumns(), { size: 7.5, headerSize: 6, padY: 2.6, zebra: true });

  w.need(90);
  w.y += 14;
  w.eyebrow('Annex C');
  w.pen.line('Test-lead nulls and dismissed faults', w.frame.left, w.y, { size: 16, weight: 600 });
  w.y += 25;
  w.section('Test-lead nulls used', 30);
  leadNullsTable(w, p);
  w.section('Faults dismissed by the technical director as typing mistakes', 30);
  dismissedTable(w, p.dismissedFaults);
  w.signatureAnnex('Annex D', doc.jws, doc.keyId);
}

// The strip certificate shows its readings as a grid: one row per item, one column per test, in
// the checklist's own order (a cable with its loop, then a piste).
const SHORT: Record<TestKind, string> = {
  continuity: 'Cont.',
  insulation: 'Ins.',
  loop: 'Loop',
  'piste-end-to-end': 'Piste end to end',
  'piste-earth': 'Piste earth',
};
const GRID: { key: string; header: string }[] = [
  ...stepsForKind('floor-cable', { loopRequired: ['floor-cable'] }),
  ...stepsForKind('piste', {}),
].map((st) => ({
  key: `${st.testKind}|${st.conductors}`,
  header: st.testKind.startsWith('piste') ? SHORT[st.testKind] : `${SHORT[st.testKind]} ${st.conductors}`,
}));
interface GridRow {
  position: string;
  assetTag: string | null;
  cells: Map<string, CertifiedReading>;
  other: CertifiedReading[];
}

function readingGrid(readings: CertifiedReading[]) {
  const rows = new Map<string, GridRow>();
  for (const r of readings) {
    const k = `${r.position}|${r.assetTag}`;
    const row: GridRow = rows.get(k) ?? { position: r.position, assetTag: r.assetTag, cells: new Map(), other: [] };
    const key = `${r.testKind}|${r.conductors}`;
    if (GRID.some((g) => g.key === key)) row.cells.set(key, r);
    else row.other.push(r);
    rows.set(k, row);
  }
  const list = [...rows.values()];
  const used = GRID.filter((g) => list.some((row) => row.cells.has(g.key)));
  const columns: Column<GridRow>[] = [
    { header: 'Position', width: 70, value: (row) => row.position, style: () => ({ weight: 500 }) },
    { header: 'Asset tag', width: 44, value: (row) => row.assetTag ?? '—', nowrap: true },
    ...used.map(
      (g): Column<GridRow> => ({
        header: g.header,
        width: 40,
        nowrap: true,
        value: (row) => {
          const r = row.cells.get(g.key);
          return r ? valueText(r) : '';
        },
        style: (row) => {
          const r = row.cells.get(g.key);
          return r && r.verdict !== 'pass' ? { color: verdictColour(r.verdict), weight: 600 } : {};
        },
        mark: (row, pen, x, y, size) => {
          const r = row.cells.get(g.key);
          return r ? verdictMark(pen, r.verdict, x, y, size) : 0;
        },
      }),
    ),
  ];
  if (list.some((row) => row.other.length > 0))
    columns.push({
      header: 'Other',
      width: 60,
      value: (row) => row.other.map((r) => `${testLabel(r.testKind)} ${r.conductors} ${valueText(r)}`).join('; '),
    });
  return { rows: list, columns };
}

/**
 * The venue with the strip's zone, unless the venue's name already says it: a zone "Annex" in
 * "Riverside Annex" would read "Riverside Annex, Annex".
 */
export function placeOf(venueName: string, zone: string | null | undefined): string {
  const z = zone?.trim();
  if (!z) return venueName;
  const words = (t: string) => t.toLocaleLowerCase().split(/[^\p{L}\p{N}]+/u).filter(Boolean);
  const name = words(venueName).join(' ');
  return ` ${name} `.includes(` ${words(z).join(' ')} `) ? venueName : `${venueName}, ${z}`;
}

function renderStrip(w: Writer, doc: CertificateDocument) {
  const { payload: p } = doc;
  const strip = p.strips[0];
  w.newPage('portrait');
  w.eyebrow('Strip certificate · electrical testing of competition equipment');
  w.title(strip.label, `${p.venue.name} · ${p.event.name} · ${formatDateRange(p.event.startsOn, p.event.endsOn)}`);
  w.text(
    `This certifies that the competition equipment of ${strip.label} listed below was tested, and that the latest reading of every required test was within the limits of the profile named here when the venue was signed off.`,
    { size: 9.5 },
    10,
  );
  w.facts([
    ['Venue', placeOf(p.venue.name, strip.zone)],
    ['Items by asset tag', strip.items.map((i) => i.assetTag ?? i.position).join(', ')],
    ['Readings', `${strip.readings}${strip.nearLimit ? `, ${strip.nearLimit} near limit` : ', none near limit'}`],
    ...commonFacts(p).filter(([k]) => k !== 'Limit profile'),
    ['Venue certificate', p.related.venueCertificate ?? '—'],
  ], 4);
  w.section('Readings', 40);
  const grid = readingGrid(doc.readings);
  w.table(grid.rows, grid.columns, { size: 7.5, headerSize: 6, padY: 3.4 });
  const nulls = p.leadNulls.map((n) => `${formatOhm(n.valueOhm)} (${n.takenBy}, ${timeUtc(n.takenAt)} UTC${n.meter ? `, ${n.meter}` : ''})`);
  w.text(
    `Values are the latest reading of each test, in ohms; OL is over range (open), which passes for insulation. Marks: ${legendText()}. ${nulls.length ? `The test-lead null was subtracted from what the meter showed: ${nulls.join('; ')}.` : 'No test-lead null was subtracted.'}`,
    { size: 7, color: COLOURS.soft },
    6,
  );
  if (p.dismissedFaults.length > 0) {
    w.section('Faults dismissed by the technical director as typing mistakes', 30);
    dismissedTable(w, p.dismissedFaults, false);
  }
  w.section(`Limits applied: ${p.profile.name}, version ${p.profile.version}`, 30);
  const used = new Set(doc.readings.map((r) => r.ruleId));
  w.ruleList(p.profile.rules.filter((r) => used.has(r.id)).map((r) => [ruleLabel(r.id), `${r.limit} · ${r.source}`]));
  w.text(`Statement of the technical director: “${p.statement}”`, { size: 8, color: COLOURS.ink }, 10);
  w.scope();
  w.signature('the annex at the end');
  w.signatureAnnex('Annex', doc.jws, doc.keyId);
}

export async function renderCertificatePdf(input: CertificateDocument): Promise<Buffer> {
  const p = input.payload;
  const what = p.kind === 'venue' ? 'Venue certificate' : 'Strip certificate';
  const name = p.kind === 'venue' ? p.venue.name : `${p.strips[0].label}, ${p.venue.name}`;
  const doc = createDocument({
    title: `${what} ${p.number}: ${name}`,
    subject: `${what} of electrical testing of competition equipment, ${p.event.name}, ${p.venue.name}`,
    keywords: ['Stripwarden', 'certificate', p.number, p.event.name, p.venue.name, ...p.strips.map((s) => s.label)].join(', '),
    creationDate: new Date(p.signedAt),
  });
  const w = new Writer(doc, p, `${what} · ${p.event.name} · ${p.venue.name}`);
  if (p.kind === 'venue') renderVenue(w, input);
  else renderStrip(w, input);
  w.footers();
  return toBuffer(doc);
}
