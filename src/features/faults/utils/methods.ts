// Which fault-location methods fit a fault, and what each one asks for.
import type { FaultKind } from '@shared/schemas/faults';
import type { LengthSystem } from '@shared/domain/units';
import { unitOf, type Dimension } from './unit-texts';

export type LocateMethod = 'loop-both-ends' | 'loop-one-end' | 'tdr' | 'murray' | 'capacitance' | 'flex';

export interface MethodField {
  name: string;
  label: string;
  /** A fixed unit (Ω, ns, nF); lengths and resistances per length follow the user's units instead. */
  unit: string;
  dimension?: Dimension;
  required: boolean;
  prefill?: 'lengthM' | 'ohmPerMetre' | 'velocityFactor';
}

/** `Cable length (ft)`, `Resistance of one line per 1000 ft (Ω/1000 ft)`, `Loop reading … (Ω)`. */
export function fieldLabel(field: MethodField, system: LengthSystem): string {
  if (field.dimension === 'per-length') {
    return `${field.label} per ${system === 'imperial' ? '1000 ft' : 'metre'} (${unitOf('per-length', system)})`;
  }
  const unit = field.dimension ? unitOf(field.dimension, system) : field.unit;
  return unit ? `${field.label} (${unit})` : field.label;
}

export const METHOD_LABELS: Record<LocateMethod, string> = {
  'loop-both-ends': 'Loop resistance from both ends',
  'loop-one-end': 'Loop resistance from one end',
  tdr: 'TDR (time-domain reflectometry)',
  murray: 'Murray loop bridge',
  capacitance: 'Capacitance ratio',
  flex: 'Flex test (found by hand)',
};

export const METHOD_HINTS: Record<LocateMethod, string> = {
  'loop-both-ends':
    'Measure the shorted pair from the apparatus end with the far end open, then from the far end with the near end open. The short’s own resistance drops out.',
  'loop-one-end': 'Measure the loop through the fault from the apparatus end, far end open. Best for a dead short.',
  tdr: 'Read the round-trip time from the incident edge to the reflection on the TDR or scope. An open reflects upwards, a short downwards.',
  murray: 'Loop the faulty line with a sound one at the far end, balance the bridge at the near end against the earth fault, and read the two arms.',
  capacitance: 'With the meter’s capacitance range, measure the broken line and a sound line against the others, from the near end (and the far end if you can).',
  flex: 'Flex the cable slowly along its length with the meter on the failing line; note where the reading jumps.',
};

const length: MethodField = { name: 'lengthM', label: 'Cable length', unit: '', dimension: 'length', required: true, prefill: 'lengthM' };
const perMetre: MethodField = { name: 'ohmPerMetre', label: 'Resistance of one line', unit: '', dimension: 'per-length', required: true, prefill: 'ohmPerMetre' };

export const METHOD_FIELDS: Record<LocateMethod, MethodField[]> = {
  'loop-both-ends': [
    { name: 'nearOhm', label: 'Loop reading from the apparatus end (far end open)', unit: 'Ω', required: true },
    { name: 'farOhm', label: 'Loop reading from the far end (apparatus end open)', unit: 'Ω', required: true },
    length,
    perMetre,
  ],
  'loop-one-end': [
    { name: 'loopOhm', label: 'Loop reading through the fault', unit: 'Ω', required: true },
    perMetre,
    { name: 'faultOhm', label: 'The fault’s own resistance, if known', unit: 'Ω', required: false },
    { ...length, required: false },
  ],
  tdr: [
    { name: 'roundTripNs', label: 'Round-trip time to the reflection', unit: 'ns', required: true },
    { name: 'velocityFactor', label: 'Velocity factor of the cable', unit: '', required: true, prefill: 'velocityFactor' },
    { name: 'riseTimeNs', label: 'Rise time of the incident edge', unit: 'ns', required: false },
    { ...length, required: false },
  ],
  murray: [
    { name: 'ratioP', label: 'Bridge arm on the faulty line’s side (P)', unit: '', required: true },
    { name: 'ratioQ', label: 'Bridge arm on the sound line’s side (Q)', unit: '', required: true },
    length,
  ],
  capacitance: [
    { name: 'faultedNf', label: 'Broken line from the apparatus end', unit: 'nF', required: true },
    { name: 'soundNf', label: 'A sound line over the whole length', unit: 'nF', required: true },
    { name: 'farFaultedNf', label: 'Broken line from the far end', unit: 'nF', required: false },
    length,
  ],
  flex: [
    { name: 'distanceM', label: 'Where the reading jumped, from the named end', unit: '', dimension: 'length', required: true },
    { name: 'uncertaintyM', label: 'How precisely (±)', unit: '', dimension: 'length', required: false },
    { ...length, required: false },
  ],
};

/** The methods that fit, most useful first (the product brief's pairing of faults and methods). */
export function methodsFor(kind: FaultKind, conductors: string): LocateMethod[] {
  if (conductors.startsWith('piste')) return ['flex'];
  switch (kind) {
    case 'short':
      // A line to the earth/guard line C: the Murray loop, with the other line as the sound one.
      return conductors.includes('C') ? ['murray', 'loop-both-ends', 'tdr', 'flex'] : ['loop-both-ends', 'loop-one-end', 'tdr', 'flex'];
    case 'open':
      return ['capacitance', 'tdr', 'flex'];
    case 'high-resistance':
      return ['loop-one-end', 'tdr', 'flex'];
    case 'intermittent':
      return ['flex'];
  }
}
