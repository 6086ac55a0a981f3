// One symbol per meaning, on every screen, e-mail, certificate PDF and legend. Each meaning has a
// shape (drawn from the SVG path below, so the PDF does not depend on the font having the glyph:
// IBM Plex Sans has none of the geometric shapes), a text glyph for plain-text places (e-mail,
// sign-off lists), a tone and a word. A symbol of a reading means the same thing when it marks a
// strip or a fault: a triangle is always a failure, a filled circle always good, a ring always
// "nothing measured yet".
import { STRIP_STATUS_LABELS, type StripStatus } from './progress';

export type SymbolShape =
  'circle' | 'ring' | 'triangle' | 'diamond' | 'target' | 'half' | 'dash' | 'square' | 'box' | 'hourglass' | 'octagon' | 'pause';
export type SymbolTone = 'pass' | 'near' | 'fail' | 'idle' | 'brand' | 'brass';

/** The outline of each shape in a 16 × 16 box: `fill` is filled, `stroke` drawn with a 2-unit line. */
export const SHAPE_PATHS: Record<SymbolShape, { fill?: string; stroke?: string; name: string }> = {
  circle: { fill: 'M8 1.5a6.5 6.5 0 1 1 0 13a6.5 6.5 0 1 1 0-13z', name: 'filled circle' },
  ring: { stroke: 'M8 2.75a5.25 5.25 0 1 1 0 10.5a5.25 5.25 0 1 1 0-10.5z', name: 'ring' },
  triangle: { fill: 'M8 1.5 15 14.5H1z', name: 'triangle' },
  diamond: { fill: 'M8 1 15 8 8 15 1 8z', name: 'diamond' },
  target: { fill: 'M8 5.5a2.5 2.5 0 1 1 0 5a2.5 2.5 0 1 1 0-5z', stroke: 'M8 2a6 6 0 1 1 0 12a6 6 0 1 1 0-12z', name: 'ring with a dot' },
  half: {
    fill: 'M8 2.25a5.75 5.75 0 0 1 0 11.5z',
    stroke: 'M8 2.25a5.75 5.75 0 1 1 0 11.5a5.75 5.75 0 1 1 0-11.5z',
    name: 'half-filled circle',
  },
  dash: { fill: 'M2.5 6h11a1 1 0 0 1 1 1v2a1 1 0 0 1-1 1h-11a1 1 0 0 1-1-1v-2a1 1 0 0 1 1-1z', name: 'bar' },
  square: { fill: 'M3 2h10a1 1 0 0 1 1 1v10a1 1 0 0 1-1 1H3a1 1 0 0 1-1-1V3a1 1 0 0 1 1-1z', name: 'filled square' },
  box: { stroke: 'M3 3h10v10H3z', name: 'square outline' },
  hourglass: { fill: 'M3 1.5h10v1.5L9.2 8 13 13v1.5H3V13l3.8-5L3 3z', name: 'hourglass' },
  octagon: { fill: 'M5.5 1h5L15 5.5v5L10.5 15h-5L1 10.5v-5z', name: 'octagon' },
  pause: { fill: 'M3 2h3.5v12H3zM9.5 2H13v12H9.5z', name: 'two bars' },
};

export interface SymbolLook {
  shape: SymbolShape;
  /** For plain text (e-mail, lists): the Unicode shape of the same meaning. */
  glyph: string;
  tone: SymbolTone;
  label: string;
}

// The five meanings the issue names, and nothing else uses their shapes for another meaning.
export const READING_SYMBOLS = {
  pass: { shape: 'circle', glyph: '●', tone: 'pass', label: 'Pass' },
  'near-limit': { shape: 'diamond', glyph: '◆', tone: 'near', label: 'Near limit' },
  fail: { shape: 'triangle', glyph: '▲', tone: 'fail', label: 'Fail' },
  'not-measured': { shape: 'ring', glyph: '○', tone: 'idle', label: 'Not measured' },
  located: { shape: 'target', glyph: '◎', tone: 'fail', label: 'Located' },
} as const satisfies Record<string, SymbolLook>;
export type ReadingSymbol = keyof typeof READING_SYMBOLS;

export const verdictSymbol = (v: 'pass' | 'near-limit' | 'fail' | null | undefined): SymbolLook => READING_SYMBOLS[v ?? 'not-measured'];

/** A strip's state, in the same language: nothing measured ○, under way ◐, all good ●, a failure ▲. */
export const STRIP_SYMBOLS: Record<StripStatus, SymbolLook> = {
  'not-started': { shape: 'ring', glyph: '○', tone: 'idle', label: STRIP_STATUS_LABELS['not-started'] },
  'in-progress': { shape: 'half', glyph: '◐', tone: 'brand', label: STRIP_STATUS_LABELS['in-progress'] },
  clear: { shape: 'circle', glyph: '●', tone: 'pass', label: STRIP_STATUS_LABELS['clear'] },
  'fault-open': { shape: 'triangle', glyph: '▲', tone: 'fail', label: STRIP_STATUS_LABELS['fault-open'] },
  withdrawn: { shape: 'dash', glyph: '▬', tone: 'idle', label: STRIP_STATUS_LABELS['withdrawn'] },
  // Suspended mid-event: a mark of its own (two bars, like a paused bout), in the failure's tone.
  'out-of-service': { shape: 'pause', glyph: '⏸', tone: 'fail', label: STRIP_STATUS_LABELS['out-of-service'] },
};

/** A fault's state: open is a failure ▲, located ◎, repaired and waiting for its retest ◐, closed ●. */
export const FAULT_SYMBOLS = {
  open: { shape: 'triangle', glyph: '▲', tone: 'fail', label: 'Open' },
  located: { shape: 'target', glyph: '◎', tone: 'fail', label: 'Located' },
  repaired: { shape: 'half', glyph: '◐', tone: 'near', label: 'Repaired, to retest' },
  closed: { shape: 'circle', glyph: '●', tone: 'pass', label: 'Closed' },
} as const satisfies Record<string, SymbolLook>;

/** Other states that need a mark, in shapes of their own (never one of the five above). */
export const OTHER_SYMBOLS = {
  'waiting-to-send': { shape: 'hourglass', glyph: '⧗', tone: 'brass', label: 'Waiting to send' },
  'needs-you': { shape: 'octagon', glyph: '⯃', tone: 'fail', label: 'Needs you' },
  caution: { shape: 'octagon', glyph: '⯃', tone: 'brass', label: 'Caution' },
} as const satisfies Record<string, SymbolLook>;

/** The legend, in the words a certificate or an e-mail prints beside the drawn shapes. */
export function legendText(meanings: readonly ReadingSymbol[] = ['pass', 'near-limit', 'fail']): string {
  const r = READING_SYMBOLS;
  return meanings.map((k) => `${SHAPE_PATHS[r[k].shape].name}: ${r[k].label.toLowerCase()}`).join(', ');
}
