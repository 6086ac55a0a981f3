// Reading normalisation: what a technician types from a multimeter's display → SI value.
//
// Prefix case matters, as on the meter's display: `m` is milli and `M` is mega, so `800m` is
// 0.8 Ω and `22M` is 22 MΩ. `k` and `K` both mean kilo (meters print either), `meg` means mega.
// `u`, `µ` (micro sign U+00B5) and `μ` (Greek mu U+03BC) all mean micro.
// A comma is a decimal separator (`0,8` = 0.8); there is no thousands separator, so a number that
// reads as well with one ("1,000", "2.500") is refused with both readings offered.

export type Quantity = 'resistance' | 'capacitance' | 'time';

export type ParsedReading =
  | {
      ok: true;
      /** SI: ohm, farad or second; null when the meter shows over range. */
      value: number | null;
      overRange: boolean;
      display: string;
    }
  | { ok: false; message: string };

/**
 * What a handheld meter can plausibly show. Anything outside is a typo (a wrong prefix, a
 * missing decimal point), so it is refused rather than stored.
 * - resistance 0 … 2 GΩ (insulation testers stop about there; beyond, the meter shows OL)
 * - capacitance 1 pF … 100 mF (capacitance ranges of handheld meters)
 * - time 0.1 ns … 10 s (TDR delays and scope time bases)
 */
export const READING_BOUNDS: Record<Quantity, { min: number; max: number }> = {
  resistance: { min: 0, max: 2e9 },
  capacitance: { min: 1e-12, max: 0.1 },
  time: { min: 1e-10, max: 10 },
};

/**
 * The most a test-lead null may be. Good leads with their tips touching read a few tenths of an
 * ohm at most; leads that read more than 1 Ω are worn and must be replaced, not nulled away
 * (common practice, no published value). A null above this is refused.
 */
export const LEAD_NULL_MAX_OHM = 1;

const UNIT_SYMBOL: Record<Quantity, string> = { resistance: 'Ω', capacitance: 'F', time: 's' };

const EXAMPLES: Record<Quantity, string> = {
  resistance: 'e.g. 0.8, 800 mΩ, 1.2 kΩ, 22 MΩ or OL',
  capacitance: 'e.g. 470 pF, 1.2 nF or 2.2 µF',
  time: 'e.g. 96 ns, 1.2 µs or 5 ms',
};

const EXPECTED: Record<Quantity, string> = {
  resistance: 'a resistance in Ω is expected',
  capacitance: 'a capacitance in F (pF, nF, µF) is expected',
  time: 'a time in s (ns, µs, ms) is expected',
};

// Meters and technicians write over range in all of these ways; compared after lower-casing
// and removing spaces and dots, so `O.L.`, `o l` and `Over range` all match.
const OVER_RANGE_WORDS = new Set(['ol', 'open', '∞', 'inf', 'infinity', 'over', 'overrange', 'overload']);

const PREFIX_EXPONENT: Record<string, number> = {
  p: -12,
  n: -9,
  µ: -6,
  m: -3,
  '': 0,
  k: 3,
  K: 3,
  M: 6,
  meg: 6,
  Meg: 6,
  MEG: 6,
  G: 9,
};

type UnitKind = Quantity | 'voltage' | 'current' | 'frequency' | 'inductance';

// Longest first, so `ohms` is not read as `ohm` + `s` (seconds).
const UNIT_SUFFIXES: Array<{ suffix: string; kind: UnitKind; anyCase: boolean }> = [
  { suffix: 'ohms', kind: 'resistance', anyCase: true },
  { suffix: 'ohm', kind: 'resistance', anyCase: true },
  { suffix: 'Ω', kind: 'resistance', anyCase: false },
  { suffix: 'farads', kind: 'capacitance', anyCase: true },
  { suffix: 'farad', kind: 'capacitance', anyCase: true },
  { suffix: 'F', kind: 'capacitance', anyCase: true },
  { suffix: 'secs', kind: 'time', anyCase: false },
  { suffix: 'sec', kind: 'time', anyCase: false },
  { suffix: 's', kind: 'time', anyCase: false },
  { suffix: 'Hz', kind: 'frequency', anyCase: true },
  { suffix: 'V', kind: 'voltage', anyCase: false },
  { suffix: 'A', kind: 'current', anyCase: false },
  { suffix: 'H', kind: 'inductance', anyCase: false },
];

const NUMBER_PATTERN = /^([+-]?)(\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE]([+-]?\d+))?\s*(.*)$/s;

export function parseReading(text: string, quantity: Quantity = 'resistance', opts?: { leadOffsetOhm?: number }): ParsedReading {
  const leadOffsetOhm = opts?.leadOffsetOhm ?? 0;
  if (quantity === 'resistance' || opts?.leadOffsetOhm !== undefined) {
    if (!Number.isFinite(leadOffsetOhm) || leadOffsetOhm < 0 || leadOffsetOhm > LEAD_NULL_MAX_OHM) {
      return fail(
        `The test-lead offset must be between 0 and ${LEAD_NULL_MAX_OHM} Ω (got ${String(leadOffsetOhm)}); null the leads again with their tips touching.`,
      );
    }
  }
  if (typeof text !== 'string') return fail(`Enter a reading, ${EXAMPLES[quantity]}.`);

  const trimmed = normaliseCharacters(text).trim();
  if (trimmed === '') return fail(`Enter a reading, ${EXAMPLES[quantity]}.`);

  if (OVER_RANGE_WORDS.has(trimmed.toLowerCase().replace(/[\s.]/g, ''))) {
    if (quantity !== 'resistance') {
      return fail(`Over range (“${trimmed}”) is only a valid reading for a resistance; ${EXPECTED[quantity]}, ${EXAMPLES[quantity]}.`);
    }
    return { ok: true, value: null, overRange: true, display: 'OL' };
  }

  const match = NUMBER_PATTERN.exec(trimmed);
  if (!match) return fail(`“${trimmed}” is not a reading; ${EXPECTED[quantity]}, ${EXAMPLES[quantity]}.`);
  const [, sign, mantissaText, exponentText, unitText] = match as unknown as [string, string, string, string | undefined, string];
  if (/^[.,]\d/.test(unitText)) {
    return fail(`“${trimmed}” has more than one decimal separator; ${EXAMPLES[quantity]}.`);
  }

  const unit = splitUnit(unitText.trim(), quantity, trimmed);
  if (!unit.ok) return unit;

  // A point before a unit prefix is kept: "1.000k" is how a meter on its kΩ range shows 1 kΩ.
  const ambiguous =
    exponentText === undefined && !(unit.prefix !== '' && mantissaText.includes('.')) ? thousandsReadings(mantissaText) : null;
  if (ambiguous) {
    const u = `${unit.prefix}${UNIT_SYMBOL[quantity]}`;
    const typed = (digits: string) => `${sign}${digits}${unit.prefix}`;
    return fail(
      `“${trimmed}” could be read two ways: did you mean ${sign}${ambiguous.thousands} ${u} or ${sign}${ambiguous.decimal} ${u}? ` +
        `Type ${typed(ambiguous.thousands)} for the first, ${typed(ambiguous.decimalTyped)} for the second.`,
    );
  }

  const exponent = Number(exponentText ?? '0') + unit.exponent;
  // Rebuilding a decimal string keeps 800m exactly 0.8 (800 * 0.001 would not always be).
  const magnitude = Number(`${mantissaText.replace(',', '.')}e${exponent}`);
  if (!Number.isFinite(magnitude)) {
    return fail(`“${trimmed}” is too large to be a reading (the exponent overflows); ${EXAMPLES[quantity]}.`);
  }
  if (underflows(mantissaText, magnitude)) {
    return fail(
      `“${trimmed}” is too small to be a reading (the exponent underflows, so it would read as 0); check the exponent. ${EXAMPLES[quantity]}.`,
    );
  }
  const value = sign === '-' ? -magnitude : magnitude;
  const symbol = UNIT_SYMBOL[quantity];

  if (value < 0) {
    const hint = quantity === 'resistance' ? ' If the meter shows a negative value, null the test leads again and re-measure.' : '';
    return fail(`A ${quantity} reading cannot be negative (${formatSi(value, symbol)}).${hint}`);
  }
  const bounds = READING_BOUNDS[quantity];
  if (value > bounds.max) {
    const hint = quantity === 'resistance' ? ' If the meter shows over range, enter OL.' : ' Check the prefix.';
    return fail(
      `${formatSi(value, symbol)} is more than a handheld meter shows (at most ${formatSi(bounds.max, symbol)} is expected).${hint}`,
    );
  }
  if (value < bounds.min) {
    return fail(
      `${formatSi(value, symbol)} is less than a handheld meter resolves (at least ${formatSi(bounds.min, symbol)} is expected). Check the prefix.`,
    );
  }

  if (quantity !== 'resistance') return { ok: true, value, overRange: false, display: formatSi(value, symbol) };

  if (value < leadOffsetOhm) {
    return fail(
      `${formatOhm(value)} is below the nulled test-lead resistance (${formatOhm(leadOffsetOhm)}), so the cable would measure less than nothing. Null the leads again with their tips touching and re-measure.`,
    );
  }
  // Rounded to 12 significant digits so 0.8 − 0.3 stores as 0.5, not 0.5000000000000001.
  const corrected = leadOffsetOhm === 0 ? value : roundSignificant(value - leadOffsetOhm, 12);
  return { ok: true, value: corrected, overRange: false, display: formatOhm(corrected) };
}

function normaliseCharacters(text: string): string {
  return text
    .replace(/\u2126/g, 'Ω') // OHM SIGN → GREEK CAPITAL OMEGA
    .replace(/\u03bc/g, 'µ') // GREEK MU → MICRO SIGN
    .replace(/\u2212/g, '-') // MINUS SIGN → hyphen-minus
    .replace(/\u00a0/g, ' ');
}

function splitUnit(
  unitText: string,
  quantity: Quantity,
  reading: string,
): { ok: true; exponent: number; prefix: string } | { ok: false; message: string } {
  let prefix = unitText;
  let kind: UnitKind | null = null;
  for (const candidate of UNIT_SUFFIXES) {
    const ends = candidate.anyCase ? unitText.toLowerCase().endsWith(candidate.suffix.toLowerCase()) : unitText.endsWith(candidate.suffix);
    if (ends) {
      prefix = unitText.slice(0, unitText.length - candidate.suffix.length).trim();
      kind = candidate.kind;
      break;
    }
  }
  if (kind !== null && kind !== quantity) {
    return fail(`“${reading}” is ${article(kind)} ${kind}; ${EXPECTED[quantity]}, ${EXAMPLES[quantity]}.`);
  }
  const normalisedPrefix = prefix === 'u' ? 'µ' : prefix;
  const exponent = PREFIX_EXPONENT[normalisedPrefix];
  if (exponent === undefined) {
    return fail(`“${unitText}” in “${reading}” is not a unit this field understands; ${EXPECTED[quantity]}, ${EXAMPLES[quantity]}.`);
  }
  // A bare number is taken as ohms (what the meter shows on a resistance range); for capacitance
  // and time the meter always shows a prefix, and a bare "4.7" would be 4.7 F or 4.7 s.
  if (kind === null && normalisedPrefix === '' && quantity !== 'resistance') {
    return fail(`Add the unit: ${EXPECTED[quantity]}, ${EXAMPLES[quantity]}.`);
  }
  return { ok: true, exponent, prefix: normalisedPrefix };
}

/** The smallest normal double: below it a typed number has lost its digits (1e-400 reads as 0). */
const SMALLEST_NORMAL = 2.2250738585072014e-308;

/** A mantissa with a digit other than 0 that came out as (nearly) nothing. */
function underflows(mantissaText: string, magnitude: number): boolean {
  return /[1-9]/.test(mantissaText) && Math.abs(magnitude) < SMALLEST_NORMAL;
}

/**
 * "1,000", "2.500", "12,500": one to three digits (not a lone 0), one separator, exactly three
 * digits. A thousands separator or a decimal one? Both readings, or null when the text can only
 * be a decimal ("1,5", "0,250", "1,2345", "1234,567").
 */
export function thousandsReadings(mantissaText: string): { thousands: string; decimal: string; decimalTyped: string } | null {
  const m = /^([1-9]\d{0,2})[.,](\d{3})$/.exec(mantissaText);
  if (!m) return null;
  const [, whole, part] = m as unknown as [string, string, string];
  const decimal = `${whole}.${part}`;
  // The decimal reading typed so it cannot be taken for thousands: trailing zeros off, else one more.
  const trimmed = decimal.replace(/0+$/, '').replace(/\.$/, '');
  return { thousands: `${whole}${part}`, decimal, decimalTyped: trimmed === decimal ? `${decimal}0` : trimmed };
}

function article(word: string): string {
  return /^[aeiou]/.test(word) ? 'an' : 'a';
}

function fail(message: string): { ok: false; message: string } {
  return { ok: false, message };
}

export function roundSignificant(value: number, digits: number): number {
  if (value === 0 || !Number.isFinite(value)) return value;
  return Number(value.toPrecision(digits));
}

const SI_PREFIXES: Array<[number, string]> = [
  [9, 'G'],
  [6, 'M'],
  [3, 'k'],
  [0, ''],
  [-3, 'm'],
  [-6, 'µ'],
  [-9, 'n'],
  [-12, 'p'],
];

/** Four significant digits, trailing zeros dropped: 2.5, 0.8, 1.235. */
function formatNumber(value: number, digits = 4): string {
  return String(roundSignificant(value, digits));
}

/** A value with an SI prefix chosen so the number reads between 1 and 1000. */
export function formatSi(value: number, unit: string, opts?: { minExponent?: number; maxExponent?: number }): string {
  if (Number.isNaN(value)) return '—';
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '−∞';
  if (value === 0) return `0 ${unit}`;
  const minExponent = opts?.minExponent ?? -12;
  const maxExponent = opts?.maxExponent ?? 9;
  const rounded = roundSignificant(Math.abs(value), 4);
  const candidates = SI_PREFIXES.filter(([e]) => e >= minExponent && e <= maxExponent);
  const chosen = candidates.find(([e]) => rounded >= 10 ** e) ?? candidates[candidates.length - 1]!;
  const [exponent, prefix] = chosen;
  const sign = value < 0 ? '-' : '';
  return `${sign}${formatNumber(rounded / 10 ** exponent)} ${prefix}${unit}`;
}

/** `0.8 Ω`, `1.2 kΩ`, `22 MΩ`. Below 1 Ω stays in Ω (technicians read 0.05 Ω, not 50 mΩ). */
export function formatOhm(valueOhm: number): string {
  return formatSi(valueOhm, 'Ω', { minExponent: 0 });
}

/** International foot, exact by definition (1959 agreement): 0.3048 m. */
export const METRES_PER_FOOT = 0.3048;

export function metresToFeet(lengthM: number): number {
  return lengthM / METRES_PER_FOOT;
}

export function feetToMetres(lengthFt: number): number {
  return lengthFt * METRES_PER_FOOT;
}

export type LengthSystem = 'metric' | 'imperial';

/** `7.42 m`, `12.5 m`, `3.864 km`; `24.3 ft`. Resolution fits the cable lengths of the trade. */
export function formatLength(lengthM: number, system: LengthSystem): string {
  if (!Number.isFinite(lengthM)) return '—';
  if (system === 'imperial') {
    const ft = metresToFeet(lengthM);
    return `${trimFixed(ft, Math.abs(ft) < 10 ? 2 : Math.abs(ft) < 1000 ? 1 : 0)} ft`;
  }
  const abs = Math.abs(lengthM);
  if (abs >= 1000) return `${trimFixed(lengthM / 1000, 3)} km`;
  return `${trimFixed(lengthM, abs < 10 ? 2 : 1)} m`;
}

function trimFixed(value: number, decimals: number): string {
  const text = String(Number(value.toFixed(decimals)));
  return text === '-0' ? '0' : text;
}

/** What a length field is labelled with and typed in: `m` or `ft`. */
export function lengthUnitSymbol(system: LengthSystem): 'm' | 'ft' {
  return system === 'imperial' ? 'ft' : 'm';
}

/** The word for the unit in a sentence: "in metres", "in feet". */
export function lengthUnitWord(system: LengthSystem): 'metres' | 'feet' {
  return system === 'imperial' ? 'feet' : 'metres';
}

// Rounded to 12 significant digits, as readings are, so 3 ft is 0.9144 m, not 0.9144000000000001.
/** A length typed in the user's unit → metres. */
export function lengthToMetres(value: number, system: LengthSystem): number {
  return roundSignificant(system === 'imperial' ? feetToMetres(value) : value, 12);
}

/** Metres → a number in the user's unit (feet unrounded; round for display). */
export function metresToLength(lengthM: number, system: LengthSystem): number {
  return system === 'imperial' ? metresToFeet(lengthM) : lengthM;
}

/** How a resistance per length is typed: per metre, km, foot or 1000 ft of one conductor. */
export type PerLengthUnit = 'Ω/m' | 'Ω/km' | 'Ω/ft' | 'Ω/1000 ft';

const METRES_PER_LENGTH_UNIT: Record<PerLengthUnit, number> = {
  'Ω/m': 1,
  'Ω/km': 1000,
  'Ω/ft': METRES_PER_FOOT,
  'Ω/1000 ft': 1000 * METRES_PER_FOOT,
};

/** 11.43 Ω/1000 ft → 0.0375 Ω/m. */
export function toOhmPerMetre(value: number, unit: PerLengthUnit): number {
  return roundSignificant(value / METRES_PER_LENGTH_UNIT[unit], 12);
}

/** 0.0375 Ω/m → 11.43 Ω/1000 ft (unrounded; round for display). */
export function fromOhmPerMetre(ohmPerMetre: number, unit: PerLengthUnit): number {
  return ohmPerMetre * METRES_PER_LENGTH_UNIT[unit];
}

const DECIMAL = /^([+-]?)(\d+(?:[.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/;

/**
 * A plain number as typed in a form field: `12`, `1.5`, `0,8` (comma decimal), `.5`; null otherwise,
 * and null for a number that could be read with a thousands separator (`1,000`) or whose exponent
 * overflows or underflows (`1e309`, `1e-400`). `decimalProblem` says why.
 */
export function parseDecimal(text: string): number | null {
  return decimalProblem(text) === null ? Number(text.trim().replace(',', '.')) : null;
}

/** Why a form field's text is not a plain number, in a sentence; null when it is one. */
export function decimalProblem(text: string, unit = ''): string | null {
  const trimmed = text.trim();
  const match = DECIMAL.exec(trimmed);
  if (!match) return 'Type a number.';
  const [, sign, mantissa, exponent] = match as unknown as [string, string, string, string | undefined];
  const ambiguous = exponent === undefined ? thousandsReadings(mantissa) : null;
  const u = unit ? ` ${unit}` : '';
  if (ambiguous) {
    return `“${trimmed}” could be read two ways: did you mean ${sign}${ambiguous.thousands}${u} or ${sign}${ambiguous.decimal}${u}? Type ${sign}${ambiguous.thousands} for the first, ${sign}${ambiguous.decimalTyped} for the second.`;
  }
  const value = Number(trimmed.replace(',', '.'));
  if (!Number.isFinite(value)) return `“${trimmed}” is too large (the exponent overflows).`;
  if (underflows(mantissa, value)) return `“${trimmed}” is too small (the exponent underflows, so it would read as 0).`;
  return null;
}
