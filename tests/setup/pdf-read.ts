// Reads a PDF back the way a viewer does, with Mozilla's PDF.js (its legacy build is the one for
// Node): the text of every page and the fonts it uses. A package, so the test suite needs no
// system tools beside Chromium.
import { getDocument, OPS, VerbosityLevel } from 'pdfjs-dist/legacy/build/pdf.mjs';

export interface PdfFont {
  /** The font's PostScript name as the PDF gives it (BaseFont), subset tag and all: "ABCDEF+IBMPlexSans". */
  name: string;
  /** The font program is inside the PDF (not left to the reader's machine). */
  embedded: boolean;
}

export interface PdfContents {
  /** One string per page, text items in content order, a line break where PDF.js sees the end of a line. */
  pages: string[];
  fonts: PdfFont[];
}

interface LoadedFont {
  name: string;
  missingFile?: boolean;
}

/** The text of each page and, unless `fonts: false` (it costs most of the time), the fonts used. */
export async function readPdf(pdf: Uint8Array, opts: { fonts?: boolean } = {}): Promise<PdfContents> {
  // PDF.js takes over (detaches) the buffer it is given: hand it a copy.
  const doc = await getDocument({
    data: new Uint8Array(pdf),
    verbosity: VerbosityLevel.ERRORS,
    disableFontFace: true,
    useSystemFonts: false,
  }).promise;
  try {
    const pages: string[] = [];
    const fonts = new Map<string, PdfFont>();
    for (let n = 1; n <= doc.numPages; n++) {
      const page = await doc.getPage(n);
      const content = await page.getTextContent();
      pages.push(content.items.map((i) => ('str' in i ? i.str + (i.hasEOL ? '\n' : '') : '')).join(''));
      if (opts.fonts === false) continue;
      // The fonts are known once the page's drawing operators have been read.
      const ops = await page.getOperatorList();
      ops.fnArray.forEach((fn, i) => {
        if (fn !== OPS.setFont) return;
        const id = (ops.argsArray[i] as [string, number])[0];
        const font = page.commonObjs.get(id) as LoadedFont;
        fonts.set(font.name, { name: font.name, embedded: font.missingFile !== true });
      });
    }
    return { pages, fonts: [...fonts.values()].sort((a, b) => a.name.localeCompare(b.name)) };
  } finally {
    await doc.destroy();
  }
}

/** All the text of a PDF, pages one after the other. */
export async function pdfText(pdf: Uint8Array): Promise<string> {
  return (await readPdf(pdf, { fonts: false })).pages.join('\n');
}
