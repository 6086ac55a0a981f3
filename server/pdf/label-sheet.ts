// Label sheets: A4, 3 columns × 8 rows of 70 × 37 mm labels with no gaps between them, the most
// common 24-up self-adhesive sheet (common practice). Each label has a QR code (a link on the app's
// address, shared/domain/label-codes.ts) and the same thing in words, so a typed tag works as well.
import { A4, COLOURS, createDocument, Pen, toBuffer } from './layout';
import { qrPng } from './qr-png';

export interface Label {
  /** The strip's name or the item's asset tag: the largest text on the label. */
  title: string;
  /** Short lines, wrapped: the venue and zone of a strip, the kind and description of an item. */
  lines: string[];
  /** What a scan opens, said in small print. */
  caption: string;
  /** The QR code's content. */
  url: string;
}

export interface LabelSheetDocument {
  title: string;
  subject: string;
  createdAt: string;
  labels: Label[];
}

const MM = 72 / 25.4;
export const LABEL_GRID = {
  columns: 3,
  rows: 8,
  widthMm: 70,
  heightMm: 37,
  /** Inside each label, so a sheet fed a little askew still shows the whole code. */
  paddingMm: 4,
} as const;
const PER_PAGE = LABEL_GRID.columns * LABEL_GRID.rows;

/** A label's top-left corner on its page, in points: the grid centred on the sheet. */
export function labelOrigin(index: number) {
  const slot = index % PER_PAGE;
  const w = LABEL_GRID.widthMm * MM;
  const h = LABEL_GRID.heightMm * MM;
  const left = (A4.width - LABEL_GRID.columns * w) / 2;
  const top = (A4.height - LABEL_GRID.rows * h) / 2;
  return {
    page: Math.floor(index / PER_PAGE),
    x: left + (slot % LABEL_GRID.columns) * w,
    y: top + Math.floor(slot / LABEL_GRID.columns) * h,
  };
}

// 8 pixels per module and the standard quiet zone of 4 modules (ISO/IEC 18004 §9.1): sharp at about
// 300 dpi in a 29 mm square, and readable by a tablet's camera at arm's length.
const QR_PNG = { scale: 8, quiet: 4 };

function drawLabel(pen: Pen, label: Label, png: Buffer, x: number, y: number) {
  const pad = LABEL_GRID.paddingMm * MM;
  const h = LABEL_GRID.heightMm * MM;
  const qr = h - 2 * pad;
  pen.doc.image(png, x + pad, y + pad, { width: qr, height: qr });
  const tx = x + pad + qr + 2.5 * MM;
  const tw = x + LABEL_GRID.widthMm * MM - pad - tx;
  // The title is printed whole (a tag is typed from it): smaller type for a long one.
  let titleStyle = { size: 12, weight: 700 as const, color: COLOURS.ink };
  let titleLines = pen.wrap(label.title, tw, titleStyle);
  for (const size of [10, 8]) {
    if (titleLines.length <= 2) break;
    titleStyle = { ...titleStyle, size };
    titleLines = pen.wrap(label.title, tw, titleStyle);
  }
  let ty = y + pad + 1;
  for (const l of titleLines) {
    pen.line(l, tx, ty, titleStyle, { width: tw });
    ty += titleStyle.size * 1.17;
  }
  ty += 2;
  // The smaller lines wrap, the first to two lines at most so the next still shows (a strip's zone).
  const small = { size: 8, weight: 500 as const, color: COLOURS.soft };
  const room = Math.max(1, 4 - titleLines.length);
  const clip = (lines: string[], n: number) => (lines.length <= n ? lines : [...lines.slice(0, n - 1), `${lines[n - 1]}…`]);
  const wrapped = clip(
    label.lines.flatMap((text, i) => clip(pen.wrap(text, tw, small), i === 0 ? 2 : room)),
    room,
  );
  for (const text of wrapped) {
    pen.line(text, tx, ty, small, { width: tw });
    ty += 10.5;
  }
  pen.line(label.caption, tx, y + h - pad - 7, { size: 6.5, color: COLOURS.faint }, { width: tw });
}

export async function renderLabelSheet(sheet: LabelSheetDocument): Promise<Uint8Array> {
  const doc = createDocument({
    title: sheet.title,
    subject: sheet.subject,
    keywords: 'labels, QR',
    creationDate: new Date(sheet.createdAt),
  });
  const pen = new Pen(doc);
  sheet.labels.forEach((label, i) => {
    const at = labelOrigin(i);
    if (i % PER_PAGE === 0) doc.addPage({ size: 'A4', margin: 0 });
    drawLabel(pen, label, qrPng(label.url, QR_PNG), at.x, at.y);
  });
  return new Uint8Array(await toBuffer(doc));
}
