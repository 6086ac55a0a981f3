// The locator form's texts → one POST /api/fault-location body, checked by the same schema and
// the same engine as the server, so the estimate shows as the technician types.

import { FaultLocationError, ohmPerMetreFromConductorSize, runFaultLocation, type FaultLocationAnswer } from '@shared/domain/fault-location';
import { faultLocationRequestSchema, type FaultLocationRequest } from '@shared/schemas/fault-location';
import { toOhmPerMetre, type LengthSystem, type PerLengthUnit } from '@shared/domain/units';
import { parseLength, parsePositiveNumber, parseQuantity, parseVelocityFactor, type Parsed } from './parse-inputs';

export type LocatorMethod = Exclude<FaultLocationRequest['method'], 'flex' | 'vf-calibration'>;
export type FieldKind = 'resistance' | 'capacitance' | 'time' | 'length' | 'ratio' | 'velocity-factor' | 'per-length';

export interface FieldDef {
  key: string;
  label: string;
  kind: FieldKind;
  required: boolean;
  placeholder?: string;
  hint?: string;
}

export interface MethodDef {
  method: LocatorMethod;
  title: string;
  when: string;
  fields: FieldDef[];
  /** The loop methods need Ω per metre of one conductor. */
  perMetre: boolean;
}

export const PER_METRE_SOURCES = ['reading', 'size', 'value'] as const;
export type PerMetreSource = (typeof PER_METRE_SOURCES)[number];

const length = (required: boolean, label = 'Cable length'): FieldDef => ({
  key: 'lengthM',
  label: required ? label : `${label} (if known)`,
  kind: 'length',
  required,
  placeholder: '12',
});

export const METHODS: MethodDef[] = [
  {
    method: 'loop-both-ends',
    title: 'Loop, both ends',
    when: 'A short between two conductors (e.g. A–B) and you can reach both ends. The short’s own resistance drops out.',
    perMetre: true,
    fields: [
      { key: 'nearOhm', label: 'Loop reading at the near end (far end open)', kind: 'resistance', required: true, placeholder: '0.855' },
      { key: 'farOhm', label: 'Loop reading at the far end (near end open)', kind: 'resistance', required: true, placeholder: '0.645' },
      length(true),
    ],
  },
  {
    method: 'loop-one-end',
    title: 'Loop, one end',
    when: 'A short between two conductors, measured from one end with the far end open. Give the short’s own resistance if you know it.',
    perMetre: true,
    fields: [
      { key: 'loopOhm', label: 'Loop reading through the short', kind: 'resistance', required: true, placeholder: '0.855' },
      length(false),
      { key: 'faultOhm', label: 'The short’s own resistance (if known)', kind: 'resistance', required: false, placeholder: '0.3' },
    ],
  },
  {
    method: 'murray',
    title: 'Murray loop',
    when: 'One conductor faulty to earth or screen, a sound conductor of the same size joined to it at the far end, the bridge at the near end.',
    perMetre: false,
    fields: [
      length(true),
      { key: 'ratioP', label: 'Bridge arm P (faulty conductor side)', kind: 'ratio', required: true, placeholder: '3' },
      { key: 'ratioQ', label: 'Bridge arm Q (sound conductor side)', kind: 'ratio', required: true, placeholder: '1' },
    ],
  },
  {
    method: 'capacitance',
    title: 'Capacitance ratio',
    when: 'An open (broken) conductor. Measure it and a sound conductor the same way, against the other conductors.',
    perMetre: false,
    fields: [
      length(true),
      { key: 'faultedNf', label: 'Broken conductor, from the near end', kind: 'capacitance', required: true, placeholder: '0.9 nF' },
      { key: 'soundNf', label: 'A sound conductor, whole length', kind: 'capacitance', required: true, placeholder: '1.2 nF' },
      { key: 'farFaultedNf', label: 'Broken conductor, from the far end (if reachable)', kind: 'capacitance', required: false, placeholder: '0.3 nF' },
    ],
  },
  {
    method: 'tdr',
    title: 'TDR (pulse echo)',
    when: 'A pulse sent down the pair comes back from the fault: an open reflects up, a short down.',
    perMetre: false,
    fields: [
      { key: 'roundTripNs', label: 'Time from incident edge to reflection', kind: 'time', required: true, placeholder: '96 ns' },
      { key: 'velocityFactor', label: 'Velocity factor of the cable', kind: 'velocity-factor', required: true, placeholder: '0.66' },
      { key: 'riseTimeNs', label: 'Rise time of the pulse (if known)', kind: 'time', required: false, placeholder: '4 ns' },
      length(false),
    ],
  },
];

export function methodDef(method: LocatorMethod): MethodDef {
  return METHODS.find((m) => m.method === method)!;
}

/** A resistance per length is typed per km, or per 1000 ft (per metre or foot would be tiny numbers). */
export function perLengthUnit(system: LengthSystem): PerLengthUnit {
  return system === 'imperial' ? 'Ω/1000 ft' : 'Ω/km';
}

export function perMetreField(source: PerMetreSource, system: LengthSystem): FieldDef {
  if (source === 'reading') {
    return {
      key: 'conductorOhm',
      label: 'A sound conductor of this cable, end to end',
      kind: 'resistance',
      required: true,
      placeholder: '0.45',
      hint: 'Its continuity reading; with the cable length it gives Ω per metre.',
    };
  }
  if (source === 'value') {
    return {
      key: 'ohmPerMetre',
      label: system === 'imperial' ? 'Ω per 1000 ft of one conductor' : 'Ω per km of one conductor',
      kind: 'per-length',
      required: true,
      placeholder: system === 'imperial' ? '11.4' : '37.5',
    };
  }
  return { key: 'ohmPerMetre', label: 'Conductor size', kind: 'per-length', required: true };
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

export function parseField(def: FieldDef, text: string, system: LengthSystem): Parsed {
  switch (def.kind) {
    case 'resistance':
      return parseQuantity(text, 'resistance', 'Ω');
    case 'capacitance': {
      const parsed = parseQuantity(text, 'capacitance', 'nF');
      return parsed.ok ? { ...parsed, value: parsed.value * 1e9 } : parsed;
    }
    case 'time': {
      const parsed = parseQuantity(text, 'time', 'ns');
      return parsed.ok ? { ...parsed, value: parsed.value * 1e9 } : parsed;
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
      return { ok: true, value: perMetre, display: `${Number(perMetre.toPrecision(4))} Ω/m` };
    }
  }
}

export interface LocatorState {
  method: LocatorMethod;
  texts: Record<string, string>;
  perMetreSource: PerMetreSource;
  conductorSize: string;
}

export interface Built {
  request: FaultLocationRequest | null;
  /** Field key → what is wrong with what was typed (typed fields only). */
  errors: Record<string, string>;
  /** Field key → how the text was read, e.g. "855 mΩ". */
  readAs: Record<string, string>;
  missing: string[];
  /** The same engine as the server's, run here and worded in the user's units; null until the request is complete and valid. */
  answer: FaultLocationAnswer | null;
}

export function activeFields(state: Pick<LocatorState, 'method' | 'perMetreSource'>, system: LengthSystem): FieldDef[] {
  const def = methodDef(state.method);
  const fields = [...def.fields];
  if (def.perMetre) {
    fields.push(perMetreField(state.perMetreSource, system));
    // With a conductor reading the length turns it into Ω per metre, so it is needed.
    if (state.perMetreSource === 'reading') {
      return fields.map((f) => (f.key === 'lengthM' ? { ...f, required: true, label: 'Cable length' } : f));
    }
  }
  return fields;
}

export function buildRequest(state: LocatorState, system: LengthSystem): Built {
  const errors: Record<string, string> = {};
  const readAs: Record<string, string> = {};
  const missing: string[] = [];
  const body: Record<string, unknown> = { method: state.method };

  for (const field of activeFields(state, system)) {
    if (field.kind === 'per-length' && state.perMetreSource === 'size') {
      const perMetre = ohmPerMetreOfSize(state.conductorSize);
      if (perMetre === null) missing.push(field.key);
      else {
        body.ohmPerMetre = perMetre;
        readAs[field.key] = `${Number((perMetre * 1000).toPrecision(4))} Ω/km`;
      }
      continue;
    }
    const text = state.texts[field.key] ?? '';
    if (text.trim() === '') {
      if (field.required) missing.push(field.key);
      continue;
    }
    const parsed = parseField(field, text, system);
    if (!parsed.ok) errors[field.key] = parsed.message;
    else {
      body[field.key] = parsed.value;
      readAs[field.key] = parsed.display;
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
    return { request: checked.data, errors, readAs, missing, answer: null };
  }
}
