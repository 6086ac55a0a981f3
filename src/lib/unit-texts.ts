// Form texts for lengths and resistances per length, typed in the user's units (m or ft; Ω per km
// or per 1000 ft) and sent in SI (metres, Ω per metre). A text filled in from a value in metres (a prefill, or a unit switch)
// remembers that value, so switching m ↔ ft and back, or sending, never drifts by rounding.

import {
  fromOhmPerMetre,
  lengthToMetres,
  lengthUnitSymbol,
  metresToLength,
  parseDecimal,
  roundSignificant,
  toOhmPerMetre,
  type LengthSystem,
  type PerLengthUnit,
} from '@shared/domain/units';

export type Dimension = 'length' | 'per-length';

/** Per km in metric, per 1000 ft in feet, as wire tables give it (per metre or foot is a tiny number). */
export function perLengthUnit(system: LengthSystem): PerLengthUnit {
  return system === 'imperial' ? 'Ω/1000 ft' : 'Ω/km';
}

export function unitOf(dimension: Dimension, system: LengthSystem): string {
  return dimension === 'length' ? lengthUnitSymbol(system) : perLengthUnit(system);
}

/** A number in the user's unit → metres or Ω/m. */
export function toSi(value: number, dimension: Dimension, system: LengthSystem): number {
  return dimension === 'length' ? lengthToMetres(value, system) : toOhmPerMetre(value, perLengthUnit(system));
}

/** Metres or Ω/m → the text shown in the user's unit, four significant digits as the prefill has them. */
export function textOf(si: number, dimension: Dimension, system: LengthSystem): string {
  const value = dimension === 'length' ? metresToLength(si, system) : fromOhmPerMetre(si, perLengthUnit(system));
  return String(roundSignificant(value, 4));
}

export interface UnitTexts {
  texts: Record<string, string>;
  /** Field → the SI value its text was written from; gone once the person edits the text. */
  exact: Record<string, number>;
}

export function fromSiValues(
  values: Record<string, number>,
  dimensions: Record<string, Dimension | undefined>,
  system: LengthSystem,
): UnitTexts {
  const out: UnitTexts = { texts: {}, exact: {} };
  for (const [name, si] of Object.entries(values)) {
    const dimension = dimensions[name];
    if (dimension) {
      out.texts[name] = textOf(si, dimension, system);
      out.exact[name] = si;
    } else {
      out.texts[name] = String(roundSignificant(si, 4));
    }
  }
  return out;
}

export function typeText(state: UnitTexts, name: string, text: string): UnitTexts {
  const exact = { ...state.exact };
  delete exact[name];
  return { texts: { ...state.texts, [name]: text }, exact };
}

/** The SI value of a field: the remembered one, else the typed number read in the user's unit. */
export function siOf(state: UnitTexts, name: string, dimension: Dimension, system: LengthSystem): number | null {
  const exact = state.exact[name];
  if (exact !== undefined) return exact;
  const typed = parseDecimal(state.texts[name] ?? '');
  return typed === null ? null : toSi(typed, dimension, system);
}

/**
 * After a switch between metres and feet: every number typed is rewritten in the new unit (what
 * was typed keeps its length). A text that is not a number stays as it is, to be corrected.
 */
export function switchUnits(
  state: UnitTexts,
  dimensions: Record<string, Dimension | undefined>,
  from: LengthSystem,
  to: LengthSystem,
): UnitTexts {
  if (from === to) return state;
  const texts = { ...state.texts };
  const exact = { ...state.exact };
  for (const [name, dimension] of Object.entries(dimensions)) {
    if (!dimension || (texts[name] ?? '').trim() === '') continue;
    const si = siOf(state, name, dimension, from);
    if (si === null) continue;
    texts[name] = textOf(si, dimension, to);
    exact[name] = si;
  }
  return { texts, exact };
}
