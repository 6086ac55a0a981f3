// Reads the QR codes of a PDF back as a scanner would: PDF.js (legacy build, for Node) runs each
// page's drawing operators, every image painted is taken out with where it sits on the page, and
// jsQR (an independent decoder) reads it. The text near each code comes from the page's text.
import { getDocument, ImageKind, OPS, VerbosityLevel } from 'pdfjs-dist/legacy/build/pdf.mjs';
import jsQR from 'jsqr';

type Matrix = [number, number, number, number, number, number];
const times = (m: Matrix, n: Matrix): Matrix => [
  n[0] * m[0] + n[1] * m[2],
  n[0] * m[1] + n[1] * m[3],
  n[2] * m[0] + n[3] * m[2],
  n[2] * m[1] + n[3] * m[3],
  n[4] * m[0] + n[5] * m[2] + m[4],
  n[4] * m[1] + n[5] * m[3] + m[5],
];

export interface PdfQr {
  page: number;
  /** The image's box in PDF points, origin at the bottom left of the page. */
  box: { x: number; y: number; width: number; height: number };
  /** What jsQR read, or null when it could not. */
  text: string | null;
  /** The picture as drawn in the PDF, RGBA. */
  image: { width: number; height: number; rgba: Uint8ClampedArray };
}
export interface PdfTextItem {
  page: number;
  text: string;
  x: number;
  y: number;
}

interface DecodedImage {
  width: number;
  height: number;
  kind: number;
  data: Uint8ClampedArray;
}

function toRgba(img: DecodedImage): Uint8ClampedArray {
  if (img.kind === ImageKind.RGBA_32BPP) return img.data;
  const out = new Uint8ClampedArray(img.width * img.height * 4);
  if (img.kind === ImageKind.RGB_24BPP) {
    for (let i = 0, j = 0; i < img.width * img.height; i++, j += 3) out.set([img.data[j]!, img.data[j + 1]!, img.data[j + 2]!, 255], i * 4);
    return out;
  }
  // 1 bit per pixel, rows padded to whole bytes, 1 = white.
  const rowBytes = Math.ceil(img.width / 8);
  for (let y = 0; y < img.height; y++)
    for (let x = 0; x < img.width; x++) {
      const v = (img.data[y * rowBytes + (x >> 3)]! >> (7 - (x & 7))) & 1 ? 255 : 0;
      out.set([v, v, v, 255], (y * img.width + x) * 4);
    }
  return out;
}

export async function readPdfQrCodes(pdf: Uint8Array): Promise<{ codes: PdfQr[]; text: PdfTextItem[]; pages: number }> {
  const doc = await getDocument({
    data: new Uint8Array(pdf),
    verbosity: VerbosityLevel.ERRORS,
    disableFontFace: true,
    useSystemFonts: false,
  }).promise;
  try {
    const codes: PdfQr[] = [];
    const text: PdfTextItem[] = [];
    for (let n = 1; n <= doc.numPages; n++) {
      const page = await doc.getPage(n);
      const ops = await page.getOperatorList();
      let ctm: Matrix = [1, 0, 0, 1, 0, 0];
      const stack: Matrix[] = [];
      for (let i = 0; i < ops.fnArray.length; i++) {
        const fn = ops.fnArray[i];
        const args = ops.argsArray[i] as unknown[];
        if (fn === OPS.save) stack.push(ctm);
        else if (fn === OPS.restore) ctm = stack.pop() ?? ctm;
        else if (fn === OPS.transform) ctm = times(ctm, args as Matrix);
        else if (fn === OPS.paintImageXObject) {
          const img = (await new Promise((resolve) => page.objs.get(args[0] as string, resolve))) as DecodedImage;
          const rgba = toRgba(img);
          const found = jsQR(rgba, img.width, img.height);
          // The unit square mapped by the current matrix (images are drawn upright here).
          const xs = [ctm[4], ctm[4] + ctm[0]];
          const ys = [ctm[5], ctm[5] + ctm[3]];
          codes.push({
            page: n,
            box: { x: Math.min(...xs), y: Math.min(...ys), width: Math.abs(ctm[0]), height: Math.abs(ctm[3]) },
            text: found?.data ?? null,
            image: { width: img.width, height: img.height, rgba },
          });
        }
      }
      const content = await page.getTextContent();
      for (const item of content.items)
        if ('str' in item && item.str.trim() !== '')
          text.push({ page: n, text: item.str, x: item.transform[4] as number, y: item.transform[5] as number });
    }
    return { codes, text, pages: doc.numPages };
  } finally {
    await doc.destroy();
  }
}
