// Every status goes through the one symbol module, on screen (the React mark) and in the
// certificate PDF (vector shapes), and no shape means two things.
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import PDFDocument from 'pdfkit';
import { describe, expect, test } from 'vitest';
import { FAULT_STATUSES } from '../../shared/schemas/faults';
import {
  FAULT_SYMBOLS,
  OTHER_SYMBOLS,
  READING_SYMBOLS,
  SHAPE_PATHS,
  STRIP_SYMBOLS,
  legendText,
  type SymbolLook,
  type SymbolShape,
} from '../../shared/domain/symbols';
import { StatusMark } from '../../src/components/ui/status-mark';
import { drawSymbol } from '../../server/pdf/symbol-mark';

const everyLook: [string, SymbolLook][] = [
  ...Object.entries(READING_SYMBOLS).map(([k, v]) => [`reading ${k}`, v] as [string, SymbolLook]),
  ...Object.entries(STRIP_SYMBOLS).map(([k, v]) => [`strip ${k}`, v] as [string, SymbolLook]),
  ...Object.entries(FAULT_SYMBOLS).map(([k, v]) => [`fault ${k}`, v] as [string, SymbolLook]),
  ...Object.entries(OTHER_SYMBOLS).map(([k, v]) => [`other ${k}`, v] as [string, SymbolLook]),
];

/** The content stream of a one-page PDF holding only this mark, uncompressed so it can be read. */
function pdfOf(look: SymbolLook): Promise<string> {
  return new Promise((resolve) => {
    const doc = new PDFDocument({ size: [40, 40], margin: 0, compress: false });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks).toString('latin1')));
    drawSymbol(doc, look, 10, 10, 16, '#b3261e');
    doc.end();
  });
}

describe('symbols: one per meaning', () => {
  test('the five meanings (fail, near limit, pass, not measured, located) have five different shapes and glyphs', () => {
    const five = ['fail', 'near-limit', 'pass', 'not-measured', 'located'] as const;
    expect(new Set(five.map((k) => READING_SYMBOLS[k].shape)).size).toBe(5);
    expect(new Set(five.map((k) => READING_SYMBOLS[k].glyph)).size).toBe(5);
    // The two that were mixed up: ▲ is fail, never near limit; near limit and located differ.
    expect(READING_SYMBOLS.fail.glyph).toBe('▲');
    expect(READING_SYMBOLS['near-limit'].glyph).not.toBe('▲');
    expect(READING_SYMBOLS['near-limit'].shape).not.toBe(READING_SYMBOLS.located.shape);
  });

  test('a shape used for a strip or fault state means the same as for a reading (▲ always a failure, ● always good, ○ nothing measured)', () => {
    const meaningOfShape = new Map<SymbolShape, string>(Object.values(READING_SYMBOLS).map((l) => [l.shape, l.tone]));
    for (const look of [...Object.values(STRIP_SYMBOLS), ...Object.values(FAULT_SYMBOLS)]) {
      if (meaningOfShape.has(look.shape)) expect(look.tone, look.label).toBe(meaningOfShape.get(look.shape));
    }
    expect(STRIP_SYMBOLS['fault-open'].shape).toBe(READING_SYMBOLS.fail.shape);
    expect(FAULT_SYMBOLS.located.shape).toBe(READING_SYMBOLS.located.shape);
    expect(Object.keys(FAULT_SYMBOLS).sort()).toEqual([...FAULT_STATUSES].sort());
  });

  test('no other state borrows one of the five shapes', () => {
    const five = new Set<SymbolShape>(Object.values(READING_SYMBOLS).map((l) => l.shape));
    for (const look of Object.values(OTHER_SYMBOLS)) expect(five.has(look.shape), look.label).toBe(false);
  });

  test.each(everyLook)('%s renders on screen with its own shape and word', (_name, look) => {
    const html = renderToStaticMarkup(createElement(StatusMark, { shape: look.shape, tone: look.tone, label: look.label }));
    expect(html).toContain(`data-shape="${look.shape}"`);
    for (const d of [SHAPE_PATHS[look.shape].fill, SHAPE_PATHS[look.shape].stroke].filter(Boolean)) expect(html).toContain(`d="${d}"`);
    expect(html).toContain(look.label);
  });

  test.each(everyLook)('%s is drawn in the PDF as a vector shape, never as a font glyph', async (_name, look) => {
    const pdf = await pdfOf(look);
    // A path was painted (f = fill, S = stroke) and no text was set (no BT … ET block, no font).
    expect(pdf).toMatch(/\s(f|S)\n/);
    expect(pdf).not.toMatch(/\bBT\b/);
    expect(pdf).not.toContain('/Font');
  });

  test('different shapes give different drawings in the PDF', async () => {
    const streams = await Promise.all(
      Object.values(READING_SYMBOLS).map(async (l) => (await pdfOf(l)).replace(/\/CreationDate.*\n/, '').replace(/\/ID.*\n/, '')),
    );
    expect(new Set(streams).size).toBe(Object.keys(READING_SYMBOLS).length);
  });

  test('the legend names each verdict by its shape', () => {
    expect(legendText()).toBe('filled circle: pass, diamond: near limit, triangle: fail');
  });
});
