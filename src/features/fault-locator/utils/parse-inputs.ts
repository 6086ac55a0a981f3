// What a technician types → numbers in the units of the API. Resistances, capacitances and
// times go through the shared reading parser; lengths are read here (in metres or feet, the
// user's preference when no unit is typed).

import {
  decimalProblem,
  feetToMetres,
  formatLength,
  parseReading,
  thousandsReadings,
  type LengthSystem,
  type Quantity,
} from '@shared/domain/units';

export type Parsed = { ok: true; value: number; display: string } | { ok: false; message: string };

const BARE_NUMBER = /^[+-]?(\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?$/;

/**
 * A reading of the given quantity; a bare number is taken in `defaultUnit` (the unit the field
 * is labelled with), so "12.5" in a nF field is 12.5 nF, as "850m" in an Ω field is 0.85 Ω.
 */
export function parseQuantity(text: string, quantity: Quantity, defaultUnit: string): Parsed {
  const trimmed = text.trim();
  const input = BARE_NUMBER.test(trimmed) ? `${trimmed} ${defaultUnit}` : trimmed;
  const reading = parseReading(input, quantity);
  if (!reading.ok) return reading;
  if (reading.value === null) {
    return { ok: false, message: 'Over range (OL) cannot place a fault: this method needs a number. Check the meter range.' };
  }
  return { ok: true, value: reading.value, display: reading.display };
}

const LENGTH_PATTERN = /^([+-]?)(\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE]([+-]?\d+))?\s*([a-zA-Z'′’]*)$/;
const LENGTH_UNITS: Record<string, number> = {
  m: 1,
  metre: 1,
  metres: 1,
  meter: 1,
  meters: 1,
  km: 1000,
  cm: 0.01,
  mm: 0.001,
  ft: feetToMetres(1),
  feet: feetToMetres(1),
  foot: feetToMetres(1),
  "'": feetToMetres(1),
  '′': feetToMetres(1),
  '’': feetToMetres(1),
};
/** No cable of the trade is longer; more is a typo (a missing decimal point). */
export const MAX_LENGTH_M = 100_000;

/** "12", "12 m", "12m", "39.4 ft", "39'", "1.2 km" → metres; a bare number is in the user's unit. */
export function parseLength(text: string, system: LengthSystem): Parsed {
  const trimmed = text.trim().replace(/\u00a0/g, ' ');
  const example = system === 'imperial' ? 'e.g. 39.4, 39.4 ft or 12 m' : 'e.g. 12, 12 m or 39.4 ft';
  if (trimmed === '') return { ok: false, message: `Enter a length, ${example}.` };
  const match = LENGTH_PATTERN.exec(trimmed);
  if (!match) return { ok: false, message: `“${trimmed}” is not a length; ${example}.` };
  const [, sign, mantissa, exponent, unitText] = match as unknown as [string, string, string, string | undefined, string];
  const unit = unitText === '' ? (system === 'imperial' ? 'ft' : 'm') : unitText.toLowerCase();
  const factor = LENGTH_UNITS[unit];
  if (factor === undefined) return { ok: false, message: `“${unitText}” is not a length unit here; use m, km or ft (${example}).` };
  // As in the reading parser: "1,500" may be a thousands separator; a point before km is a decimal.
  const ambiguous = exponent === undefined && !(unit === 'km' && mantissa.includes('.')) ? thousandsReadings(mantissa) : null;
  if (ambiguous) {
    const u = unitText === '' ? unit : unitText;
    return {
      ok: false,
      message: `“${trimmed}” could be read two ways: did you mean ${ambiguous.thousands} ${u} or ${ambiguous.decimal} ${u}? Type ${ambiguous.thousands} for the first, ${ambiguous.decimalTyped} for the second.`,
    };
  }
  const value = Number(`${mantissa.replace(',', '.')}e${exponent ?? 0}`) * factor * (sign === '-' ? -1 : 1);
  if (!Number.isFinite(value)) return { ok: false, message: `“${trimmed}” is too large for a cable length.` };
  if (value === 0 && /[1-9]/.test(mantissa))
    return { ok: false, message: `“${trimmed}” is too small for a cable length (the exponent underflows).` };
  if (value <= 0) return { ok: false, message: 'A length must be greater than 0.' };
  if (value > MAX_LENGTH_M) return { ok: false, message: `${formatLength(value, system)} is longer than any cable here; check the unit.` };
  return { ok: true, value, display: formatLength(value, system) };
}

/** Bridge arms and other plain ratios: a positive number, decimal point or comma. */
export function parsePositiveNumber(text: string): Parsed {
  const trimmed = text.trim();
  if (!BARE_NUMBER.test(trimmed)) return { ok: false, message: `“${trimmed}” is not a number; e.g. 3 or 1.25.` };
  const problem = decimalProblem(trimmed);
  if (problem) return { ok: false, message: problem };
  const value = Number(trimmed.replace(',', '.'));
  if (!(value > 0) || !Number.isFinite(value)) return { ok: false, message: 'Must be a number greater than 0.' };
  return { ok: true, value, display: String(value) };
}

/** "0.66", "0,66" or "66 %". */
export function parseVelocityFactor(text: string): Parsed {
  const trimmed = text.trim();
  const percent = /^(.*?)\s*%$/.exec(trimmed);
  const parsed = parsePositiveNumber(percent ? percent[1]! : trimmed);
  if (!parsed.ok) return { ok: false, message: `“${trimmed}” is not a velocity factor; e.g. 0.66 or 66 %.` };
  const value = percent ? parsed.value / 100 : parsed.value;
  if (value > 1) return { ok: false, message: 'A velocity factor is at most 1 (nothing is faster than light); e.g. 0.66 or 66 %.' };
  if (value < 0.3)
    return { ok: false, message: 'A velocity factor below 0.3 is slower than any ordinary cable; calibrate on a good cable.' };
  return { ok: true, value, display: `VF ${value}` };
}

/**
 * When the user switches between metres and feet, a length typed as a bare number keeps the unit
 * it was typed in ("12" → "12 m"), so its value does not change under them.
 */
export function pinLengthUnit(text: string, typedIn: LengthSystem): string {
  return BARE_NUMBER.test(text.trim()) ? `${text.trim()} ${typedIn === 'imperial' ? 'ft' : 'm'}` : text;
}
