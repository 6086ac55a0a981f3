// Reading an equipment register from someone's spreadsheet: which column is which, and what a
// cell means (lengths in metres or feet, conductor sizes in mm² or AWG, kinds and statuses in the
// words people use). Pure functions; the server plans and writes, the client shows the same words.

import type { ImportField, ImportMapping } from '../schemas/equipment-import';

const FEET_TO_M = 0.3048;

/** Lower-case, accents and punctuation folded to spaces: "Length (ft)" → "length ft". */
export function normaliseHeader(header: string): string {
  return header
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/²/g, '2')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, ' ')
    .trim();
}

const HEADER_ALIASES: Record<ImportField, string[]> = {
  assetTag: ['asset tag', 'tag', 'asset', 'asset no', 'asset number', 'asset id', 'tag no', 'label', 'inventory no', 'inventory number'],
  kind: ['kind', 'type', 'item type', 'category', 'equipment kind', 'equipment type'],
  description: ['description', 'desc', 'item', 'name', 'details'],
  length: ['length', 'length m', 'length ft', 'length metres', 'length meters', 'length feet', 'len', 'metres', 'meters', 'feet'],
  lengthUnit: ['unit', 'units', 'length unit', 'length units', 'uom'],
  conductorMm2: [
    'conductor mm2',
    'mm2',
    'conductor size',
    'conductor',
    'cross section',
    'csa',
    'size mm2',
    'core size',
    'conductor size mm2',
  ],
  awg: ['awg', 'gauge', 'conductor awg', 'wire gauge', 'size awg', 'conductor size awg'],
  cableType: ['cable type', 'cable', 'construction', 'cable construction'],
  velocityFactor: ['velocity factor', 'vf', 'velocity', 'vop', 'nvp'],
  status: ['status', 'state', 'condition'],
  notes: ['notes', 'note', 'comments', 'comment', 'remarks'],
};

/** A mapping guessed from the header row: exact alias first, then "starts with" (e.g. "Length (ft)"). */
export function suggestMapping(headers: string[]): ImportMapping {
  const norm = headers.map(normaliseHeader);
  const used = new Set<number>();
  const mapping: ImportMapping = {};
  const fields = Object.keys(HEADER_ALIASES) as ImportField[];
  for (const pass of ['exact', 'prefix'] as const) {
    for (const field of fields) {
      if (mapping[field] !== undefined) continue;
      const aliases = HEADER_ALIASES[field];
      const index = norm.findIndex(
        (h, i) => !used.has(i) && h !== '' && aliases.some((a) => (pass === 'exact' ? h === a : h.startsWith(`${a} `))),
      );
      if (index !== -1) {
        mapping[field] = index;
        used.add(index);
      }
    }
  }
  return mapping;
}

/** The unit a header names, if any: "Length (ft)" → ft, "Length [m]" → m. */
export function unitFromHeader(header: string | undefined): 'm' | 'ft' | null {
  if (!header) return null;
  const words = normaliseHeader(header).split(' ');
  if (words.some((w) => w === 'ft' || w === 'feet' || w === 'foot')) return 'ft';
  if (words.some((w) => w === 'm' || w === 'metres' || w === 'meters' || w === 'metre' || w === 'meter')) return 'm';
  return null;
}

export function parseUnit(raw: string): 'm' | 'ft' | null {
  const s = raw.trim().toLowerCase().replace(/\.$/, '');
  if (['m', 'metre', 'metres', 'meter', 'meters', 'mtr'].includes(s)) return 'm';
  if (['ft', 'feet', 'foot', "'", '′'].includes(s)) return 'ft';
  return null;
}

/** A decimal as people type it: "12.5", "12,5" (one comma, no point), " 12 ". NaN when it is not one. */
export function parseDecimal(raw: string): number {
  let s = raw.trim().replace(/\s+/g, '');
  if (s === '') return NaN;
  if (!s.includes('.') && /^[-+]?\d+,\d+$/.test(s)) s = s.replace(',', '.');
  if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(s)) return NaN;
  return Number(s);
}

type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };

/**
 * A length in metres from the cell, its unit taken from (in order) a suffix in the cell ("40 ft",
 * "12 m", "40'"), the unit column, the header ("Length (ft)"), else metres.
 */
export function parseLength(raw: string, unitCell?: string | null, headerUnit?: 'm' | 'ft' | null): Parsed<number> {
  const m = /^\s*([-+]?[\d.,]+)\s*([a-zA-Z'′.]*)\s*$/.exec(raw);
  if (!m) return { ok: false, message: `“${raw}” is not a length (e.g. 12, 12 m or 40 ft).` };
  const value = parseDecimal(m[1]!);
  if (!Number.isFinite(value)) return { ok: false, message: `“${raw}” is not a length (e.g. 12, 12 m or 40 ft).` };
  let unit: 'm' | 'ft' | null;
  if (m[2]) {
    unit = parseUnit(m[2]);
    if (!unit) return { ok: false, message: `“${m[2]}” is not a unit of length; use m or ft.` };
  } else if (unitCell && unitCell.trim() !== '') {
    unit = parseUnit(unitCell);
    if (!unit) return { ok: false, message: `The unit “${unitCell}” is not m or ft.` };
  } else {
    unit = headerUnit ?? 'm';
  }
  if (value <= 0) return { ok: false, message: `A length must be more than 0 (got ${raw}).` };
  const metres = unit === 'ft' ? value * FEET_TO_M : value;
  return { ok: true, value: Math.round(metres * 1000) / 1000 };
}

/** A conductor size: "0.75", "0.75 mm²", "0,75mm2" → mm²; "18 AWG", "AWG 18", "#18" → AWG. */
export function parseConductor(raw: string, prefer: 'mm2' | 'awg'): Parsed<{ mm2: number } | { awg: number }> {
  const s = raw.trim().toLowerCase().replace(/\s+/g, ' ');
  const awg = /^(?:awg ?(\d{1,2})|#? ?(\d{1,2}) ?(?:awg|ga|gauge)|#(\d{1,2}))$/.exec(s);
  if (awg) return { ok: true, value: { awg: Number(awg[1] ?? awg[2] ?? awg[3]) } };
  const mm = /^([\d.,]+) ?(mm2|mm²|mm\^2|sq ?mm|mm)?$/.exec(s);
  if (mm) {
    const n = parseDecimal(mm[1]!);
    if (Number.isFinite(n)) {
      if (prefer === 'awg' && !mm[2]) {
        if (Number.isInteger(n)) return { ok: true, value: { awg: n } };
        return { ok: false, message: `“${raw}” is not an AWG size (a whole number, e.g. 18).` };
      }
      return { ok: true, value: { mm2: n } };
    }
  }
  return { ok: false, message: `“${raw}” is not a conductor size (e.g. 0.75 mm² or 18 AWG).` };
}

const KIND_WORDS: Record<string, 'floor-cable' | 'reel' | 'piste' | 'body-wire' | 'apparatus' | 'other'> = {
  'floor cable': 'floor-cable',
  floorcable: 'floor-cable',
  'floor lead': 'floor-cable',
  'ground cable': 'floor-cable',
  fc: 'floor-cable',
  reel: 'reel',
  spool: 'reel',
  'cable reel': 'reel',
  rl: 'reel',
  piste: 'piste',
  'conductive piste': 'piste',
  'metallic piste': 'piste',
  strip: 'piste',
  'body wire': 'body-wire',
  bodywire: 'body-wire',
  'body cord': 'body-wire',
  apparatus: 'apparatus',
  'scoring apparatus': 'apparatus',
  'scoring box': 'apparatus',
  'scoring machine': 'apparatus',
  box: 'apparatus',
  other: 'other',
};

export function parseKind(raw: string) {
  return KIND_WORDS[normaliseHeader(raw)] ?? null;
}

const STATUS_WORDS: Record<string, 'in-service' | 'under-repair' | 'retired'> = {
  'in service': 'in-service',
  inservice: 'in-service',
  ok: 'in-service',
  good: 'in-service',
  active: 'in-service',
  available: 'in-service',
  'under repair': 'under-repair',
  repair: 'under-repair',
  'in repair': 'under-repair',
  faulty: 'under-repair',
  broken: 'under-repair',
  retired: 'retired',
  scrapped: 'retired',
  disposed: 'retired',
};

export function parseStatus(raw: string) {
  return STATUS_WORDS[normaliseHeader(raw)] ?? null;
}

/**
 * Our own exports put an apostrophe before a cell that starts with = + - @ (so a spreadsheet does
 * not run it); reading such a file back takes it off again.
 */
export function unguardCell(cell: string): string {
  return /^'[=+\-@]/.test(cell) ? cell.slice(1) : cell;
}
