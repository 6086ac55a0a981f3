// A status mark in a PDF, drawn as vectors from the one symbol module: IBM Plex Sans has none of
// the geometric-shape glyphs (checked with fontkit), so the certificates never set them as text.
import { SHAPE_PATHS, type SymbolLook } from '../../shared/domain/symbols';

/** Draws `look`'s shape in a `size`-point square at (x, y); returns the width used. */
export function drawSymbol(
  doc: PDFKit.PDFDocument,
  look: Pick<SymbolLook, 'shape'>,
  x: number,
  y: number,
  size: number,
  colour: string,
): number {
  const shape = SHAPE_PATHS[look.shape];
  doc.save();
  doc.translate(x, y).scale(size / 16);
  if (shape.stroke) doc.path(shape.stroke).lineWidth(2).strokeColor(colour).stroke();
  if (shape.fill) doc.path(shape.fill).fill(colour);
  doc.restore();
  return size;
}
