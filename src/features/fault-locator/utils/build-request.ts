// The locate form's texts → one POST /api/fault-location body, with the inputs, labels and units
// of the one definition of each method (shared/domain/fault-methods.ts), checked by the same
// schema and the same engine as the server's, so the estimate shows as the technician types.

import {
  FaultLocationError,
  ohmPerMetreFromConductorSize,
  runFaultLocation,
  type FaultLocationAnswer,
} from '@shared/domain/fault-location';
import {
  METHOD_DEFINITIONS,
  needsPerMetre,
  plainInputs,
  type InputQuantity,
  type LocateMethod,
  type MethodInput,
} from '@shared/domain/fault-methods';
import { faultLocationRequestSchema, type FaultLocationRequest } from '@shared/schemas/fault-location';
import { lengthUnitSymbol, roundSignificant, toOhmPerMetre, type LengthSystem } from '@shared/domain/units';
import { perLengthUnit, type Dimension, type UnitTexts } from '@/lib/unit-texts';
import { parseLength, parsePositiveNumber, parseQuantity, parseVelocityFactor, type Parsed } from './parse-inputs';

export const PER_METRE_SOURCES = ['reading', 'size', 'value'] as const;
export type PerMetreSource = (typeof PER_METRE_SOURCES)[number];

export const PER_METRE_SOURCE_LABELS: Record<PerMetreSource, string> = {
  reading: 'A sound conductor’s reading',
  size: 'Conductor size (table)',
  value: 'A value per length',
};

export interface LocatorState {
  method: LocateMethod;
  /** What is typed, with the SI value of any text written from one (a prefill, a unit switch). */
  values: UnitTexts;
  perMetreSource: PerMetreSource;
  conductorSize: string;
}

/** The unit a field is typed in: Ω, nF, ns, the reader's m or ft, Ω per km or per 1000 ft; none for a ratio. */
export function unitFor(quantity: InputQuantity, system: LengthSystem): string | null {
  switch (quantity) {
    case 'resistance':
      return 'Ω';
    case 'capacitance':
      return 'nF';
    case 'time':
      return 'ns';
    case 'length':
      return lengthUnitSymbol(system);
    case 'per-length':
      return perLengthUnit(system);
    default:
      return null;
  }
}

/** Lengths and resistances per length follow the reader's units and are remembered in SI. */
export function dimensionOf(quantity: InputQuantity): Dimension | undefined {
  return quantity === 'length' ? 'length' : quantity === 'per-length' ? 'per-length' : undefined;
}

export function dimensionsOf(method: LocateMethod): Record<string, Dimension | undefined> {
  return Object.fromEntries((METHOD_DEFINITIONS[method].inputs as readonly MethodInput[]).map((i) => [i.name, dimensionOf(i.quantity)]));
}

/** Sizes of the IEC 60228 and AWG tables in shared/domain, as `mm2:0.75` / `awg:24`. */
export const CONDUCTOR_SIZES: Array<{ value: string; label: string }> = [
  ...[0.5, 0.75, 1, 1.5, 2.5].map((mm2) => ({ value: `mm2:${mm2}`, label: `${mm2} mm² flexible copper (IEC 60228)` })),
  ...[18, 20, 22, 24, 26, 28].map((awg) => ({ value: `awg:${awg}`, label: `AWG ${awg} copper` })),
];

export function ohmPerMetreOfSize(value: string): number | null {
  const [kind, size] = value.split(':');
  if (!size) return null;
  try {
    return kind === 'awg' ? ohmPerMetreFromConductorSize({ awg: Number(size) }) : ohmPerMetreFromConductorSize({ mm2: Number(size) });
  } catch {
    return null;
  }
}

/** A field as the form shows it: the definition's input, required as this form needs it. */
export interface FormField {
  input: MethodInput;
  required: boolean;
}

/** The fields of a method in the order they are asked, the Ω-per-length one by its source. */
export function formFields(state: Pick<LocatorState, 'method' | 'perMetreSource'>): FormField[] {
  const fields: FormField[] = plainInputs(state.method).map((input) => ({ input, required: input.required }));
  if (!needsPerMetre(state.method)) return fields;
  const pair = METHOD_DEFINITIONS[state.method].inputs.filter((i: MethodInput) => i.perMetre);
  const chosen = pair.find((i: MethodInput) => i.name === (state.perMetreSource === 'reading' ? 'conductorOhm' : 'ohmPerMetre'))!;
  // With a conductor's end-to-end reading, the length turns it into Ω per metre, so it is needed.
  const withLength = fields.map((f) => (f.input.name === 'lengthM' && state.perMetreSource === 'reading' ? { ...f, required: true } : f));
  return [...withLength, { input: chosen, required: true }];
}

export function parseInput(input: MethodInput, text: string, system: LengthSystem): Parsed {
  switch (input.quantity) {
    case 'resistance':
      return parseQuantity(text, 'resistance', 'Ω');
    case 'capacitance': {
      const parsed = parseQuantity(text, 'capacitance', 'nF');
      return parsed.ok ? { ...parsed, value: roundSignificant(parsed.value * 1e9, 12) } : parsed;
    }
    case 'time': {
      const parsed = parseQuantity(text, 'time', 'ns');
      return parsed.ok ? { ...parsed, value: roundSignificant(parsed.value * 1e9, 12) } : parsed;
    }
    case 'length':
      return parseLength(text, system);
    case 'ratio':
      return parsePositiveNumber(text);
    case 'velocity-factor':
      return parseVelocityFactor(text);
    case 'per-length': {
      const parsed = parseQuantity(text, 'resistance', 'Ω');
      if (!parsed.ok) return parsed;
      if (parsed.value <= 0) return { ok: false, message: 'Must be more than 0 Ω.' };
      const perMetre = toOhmPerMetre(parsed.value, perLengthUnit(system));
      return { ok: true, value: perMetre, display: `${roundSignificant(perMetre * 1000, 4)} Ω/km` };
    }
  }
}

export interface Built {
  request: FaultLocationRequest | null;
  /** Field name → what is wrong with what was typed, or what the engine refused. */
  errors: Record<string, string>;
  /** Field name → how the text was read, e.g. "645 mΩ". */
  readAs: Record<string, string>;
  missing: string[];
  /** The same engine as the server's, run here in the reader's units; null until the request is complete and valid. */
  answer: FaultLocationAnswer | null;
}

export function buildRequest(state: LocatorState, system: LengthSystem): Built {
  const errors: Record<string, string> = {};
  const readAs: Record<string, string> = {};
  const missing: string[] = [];
  const body: Record<string, unknown> = { method: state.method };

  for (const { input, required } of formFields(state)) {
    if (input.quantity === 'per-length' && state.perMetreSource === 'size') {
      const perMetre = ohmPerMetreOfSize(state.conductorSize);
      if (perMetre === null) missing.push(input.name);
      else {
        body.ohmPerMetre = perMetre;
        readAs[input.name] = `${roundSignificant(perMetre * 1000, 4)} Ω/km`;
      }
      continue;
    }
    const exact = state.values.exact[input.name];
    if (exact !== undefined) {
      body[input.name] = exact;
      continue;
    }
    const text = state.values.texts[input.name] ?? '';
    if (text.trim() === '') {
      if (required) missing.push(input.name);
      continue;
    }
    const parsed = parseInput(input, text, system);
    if (!parsed.ok) errors[input.name] = parsed.message;
    else {
      body[input.name] = parsed.value;
      readAs[input.name] = parsed.display;
    }
  }

  if (missing.length > 0 || Object.keys(errors).length > 0) return { request: null, errors, readAs, missing, answer: null };

  const checked = faultLocationRequestSchema.safeParse(body);
  if (!checked.success) {
    for (const issue of checked.error.issues) errors[String(issue.path[0] ?? 'method')] ??= issue.message;
    return { request: null, errors, readAs, missing, answer: null };
  }
  try {
    return { request: checked.data, errors, readAs, missing, answer: runFaultLocation(checked.data, system) };
  } catch (err) {
    if (!(err instanceof FaultLocationError)) throw err;
    errors[err.field] = err.message;
    // Still sent when asked: the server has its own longest-cable setting and is the authority.
    return { request: checked.data, errors, readAs, missing, answer: null };
  }
}
