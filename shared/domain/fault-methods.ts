// The fault-location methods, defined once: each method's inputs (named as in the body of
// POST /api/fault-location, with their quantity, label and what they are in a sentence), what
// the method suits and how its readings are taken; and, per kind of fault, which methods fit, in
// which order, and in one line why. The request schemas (shared/schemas/fault-location.ts) are
// built from these inputs, and both locate forms show them, so the API and a form cannot name,
// label or describe an input differently.

import type { FaultKind } from '../schemas/faults';

export const LOCATE_METHODS = ['loop-both-ends', 'loop-one-end', 'murray', 'capacitance', 'tdr', 'flex'] as const;
export type LocateMethod = (typeof LOCATE_METHODS)[number];

/**
 * What a number is. Resistance, capacitance and time are typed as a meter shows them (Ω, nF, ns,
 * with prefixes); lengths and resistance per length follow the reader's units; a ratio has none.
 */
export type InputQuantity = 'resistance' | 'capacitance' | 'time' | 'length' | 'per-length' | 'ratio' | 'velocity-factor';

export interface MethodInput {
  /** As in the request body. */
  readonly name: string;
  /** For a form, without the unit (the form adds the reader's unit). */
  readonly label: string;
  readonly quantity: InputQuantity;
  /** Required in the request body. */
  readonly required: boolean;
  /** 0 is a real value here (a dead short's loop, a fault right at the end). */
  readonly zeroAllowed?: boolean;
  /**
   * A reading taken on this fault, not a property of the cable or the instrument: two estimates
   * that share one are not independent, so they are not combined (see fault-estimates.ts).
   */
  readonly reading: boolean;
  /** The Ω-per-length pair of the loop methods: give one of the two. */
  readonly perMetre?: boolean;
  /** What the number is, with its unit, for the API's messages. */
  readonly describe: string;
  readonly placeholder?: string;
  readonly hint?: string;
}

export interface MethodDefinition {
  readonly method: LocateMethod;
  readonly title: string;
  /** The kind of fault the method is for, and what it needs. */
  readonly suits: string;
  /** How to take its readings. */
  readonly help: string;
  /** Which end the distance is counted from, in the estimate's words. */
  readonly nearEnd: string;
  readonly inputs: readonly MethodInput[];
  /**
   * The reading inputs are one observation together (a bridge balance is one ratio: one arm is
   * often left at a round value while the other is turned), so estimates share a reading only
   * when the ratio is the same.
   */
  readonly oneReading?: boolean;
}

const lengthInput = <R extends boolean>(required: R) =>
  ({
    name: 'lengthM',
    label: 'Cable length',
    quantity: 'length',
    required,
    reading: false,
    describe: 'cable length in metres',
    placeholder: '12',
  }) as const;

const perMetreInputs = [
  {
    name: 'conductorOhm',
    label: 'A sound conductor of this cable, end to end',
    quantity: 'resistance',
    required: false,
    reading: false,
    perMetre: true,
    describe: 'end-to-end reading of one sound conductor, in Ω',
    placeholder: '0.45',
    hint: 'Its continuity reading; with the cable length it gives the resistance per length.',
  },
  {
    name: 'ohmPerMetre',
    label: 'Resistance of one conductor',
    quantity: 'per-length',
    required: false,
    reading: false,
    perMetre: true,
    describe: 'resistance of one conductor per metre, in Ω/m',
    placeholder: '37.5',
  },
] as const;

export const METHOD_DEFINITIONS = {
  'loop-both-ends': {
    method: 'loop-both-ends',
    title: 'Loop resistance from both ends',
    suits: 'A short between two conductors, with both ends within reach: the short’s own resistance drops out of the distance.',
    help: 'Measure the shorted pair from the near end with the far end open, then from the far end with the near end open.',
    nearEnd: 'near end',
    inputs: [
      {
        name: 'nearOhm',
        label: 'Loop reading from the near end (far end open)',
        quantity: 'resistance',
        required: true,
        zeroAllowed: true,
        reading: true,
        describe: 'loop reading from the near end, far end open, in Ω',
        placeholder: '0.855',
      },
      {
        name: 'farOhm',
        label: 'Loop reading from the far end (near end open)',
        quantity: 'resistance',
        required: true,
        zeroAllowed: true,
        reading: true,
        describe: 'loop reading from the far end, near end open, in Ω',
        placeholder: '0.645',
      },
      lengthInput(true),
      ...perMetreInputs,
    ],
  },
  'loop-one-end': {
    method: 'loop-one-end',
    title: 'Loop resistance from one end',
    suits: 'A dead short between two conductors, measured from one end.',
    help: 'Measure the loop through the short from the near end with the far end open. Resistance in the short itself counts as cable, so give it if you know it.',
    nearEnd: 'near end',
    inputs: [
      {
        name: 'loopOhm',
        label: 'Loop reading through the short',
        quantity: 'resistance',
        required: true,
        zeroAllowed: true,
        reading: true,
        describe: 'loop reading through the short, in Ω',
        placeholder: '0.855',
      },
      lengthInput(false),
      {
        name: 'faultOhm',
        label: 'The short’s own resistance',
        quantity: 'resistance',
        required: false,
        zeroAllowed: true,
        reading: false,
        describe: 'the short’s own resistance, in Ω',
        placeholder: '0.3',
      },
      ...perMetreInputs,
    ],
  },
  murray: {
    method: 'murray',
    title: 'Murray loop bridge',
    suits: 'A line faulted to earth (line C) or to the screen, with a sound line of the same size to loop it with.',
    help: 'Join the faulted line and a sound line at the far end. At the near end put one bridge arm on each line, the supply between the arms’ junction and earth, and the detector between the two lines; adjust the arms until the detector reads zero and read both arms.',
    nearEnd: 'bridge end (near end)',
    oneReading: true,
    inputs: [
      lengthInput(true),
      {
        name: 'faultedArm',
        label: 'Bridge arm on the faulted line',
        quantity: 'ratio',
        required: true,
        reading: true,
        describe: 'the bridge arm joined to the faulted line at balance; any unit, only the ratio of the arms counts',
        placeholder: '1',
      },
      {
        name: 'soundArm',
        label: 'Bridge arm on the sound line',
        quantity: 'ratio',
        required: true,
        reading: true,
        describe: 'the bridge arm joined to the sound line at balance; any unit, only the ratio of the arms counts',
        placeholder: '3',
      },
    ],
  },
  capacitance: {
    method: 'capacitance',
    title: 'Capacitance ratio',
    suits: 'An open (broken) line, with a sound line of the same cable to compare.',
    help: 'With the meter’s capacitance range, measure the broken line and a sound line the same way, each against the other lines, from the near end (and the broken line from the far end too if you can reach it).',
    nearEnd: 'near end',
    inputs: [
      lengthInput(true),
      {
        name: 'faultedNf',
        label: 'Broken line, from the near end',
        quantity: 'capacitance',
        required: true,
        reading: true,
        describe: 'broken conductor from the near end, in nF',
        placeholder: '0.9 nF',
      },
      {
        name: 'soundNf',
        label: 'A sound line, whole length',
        quantity: 'capacitance',
        required: true,
        reading: true,
        describe: 'a sound conductor over the whole length, in nF',
        placeholder: '1.2 nF',
      },
      {
        name: 'farFaultedNf',
        label: 'Broken line, from the far end',
        quantity: 'capacitance',
        required: false,
        reading: true,
        describe: 'broken conductor from the far end, in nF',
        placeholder: '0.3 nF',
      },
    ],
  },
  tdr: {
    method: 'tdr',
    title: 'TDR (pulse echo)',
    suits:
      'Opens and low-resistance shorts: a pulse sent down the pair comes back from the fault, upwards from an open, downwards from a short.',
    help: 'Read the time from the incident edge to the reflection on the TDR or the scope.',
    nearEnd: 'instrument end (near end)',
    inputs: [
      {
        name: 'roundTripNs',
        label: 'Time from incident edge to reflection',
        quantity: 'time',
        required: true,
        reading: true,
        describe: 'time from the incident edge to the reflection, in ns',
        placeholder: '96 ns',
      },
      {
        name: 'velocityFactor',
        label: 'Velocity factor of the cable',
        quantity: 'velocity-factor',
        required: true,
        reading: false,
        describe: 'the cable’s velocity factor, e.g. 0.66',
        placeholder: '0.66',
      },
      {
        name: 'riseTimeNs',
        label: 'Rise time of the pulse',
        quantity: 'time',
        required: false,
        zeroAllowed: true,
        reading: false,
        describe: 'rise time of the incident edge, in ns',
        placeholder: '4 ns',
      },
      lengthInput(false),
    ],
  },
  flex: {
    method: 'flex',
    title: 'Flex test (found by hand)',
    suits: 'Any fault that shows while the cable moves.',
    help: 'With the meter on the failing line, flex the cable slowly along its length, plugs first, and note where the reading jumps.',
    nearEnd: 'near end',
    inputs: [
      {
        name: 'distanceM',
        label: 'Where the reading jumped, from the near end',
        quantity: 'length',
        required: true,
        zeroAllowed: true,
        reading: true,
        describe: 'distance from the named end, in metres',
        placeholder: '3',
      },
      {
        name: 'uncertaintyM',
        label: 'How precisely (±)',
        quantity: 'length',
        required: false,
        reading: false,
        describe: 'how precisely the spot was found, in metres',
        placeholder: '0.1',
      },
      lengthInput(false),
    ],
  },
} as const satisfies { [M in LocateMethod]: MethodDefinition & { method: M } };

/** The velocity-factor calibration on a known-good cable: not a location, but sent to the same endpoint. */
export const VF_CALIBRATION_INPUTS = [
  {
    name: 'roundTripNs',
    label: 'Round trip to its far-end reflection',
    quantity: 'time',
    required: true,
    reading: true,
    describe: 'time from the incident edge to the far-end reflection, in ns',
    placeholder: '121 ns',
  },
  {
    name: 'lengthM',
    label: 'Length of the good cable',
    quantity: 'length',
    required: true,
    reading: false,
    describe: 'length of the known-good cable in metres',
    placeholder: '12',
  },
] as const satisfies readonly MethodInput[];

export function methodDefinition(method: LocateMethod): MethodDefinition {
  return METHOD_DEFINITIONS[method];
}

/** The inputs a reading form shows one by one (the Ω-per-length pair is chosen separately). */
export function plainInputs(method: LocateMethod): readonly MethodInput[] {
  return METHOD_DEFINITIONS[method].inputs.filter((i: MethodInput) => !i.perMetre);
}

/** Whether the method needs one conductor's resistance per length (the loop methods). */
export function needsPerMetre(method: LocateMethod): boolean {
  return METHOD_DEFINITIONS[method].inputs.some((i: MethodInput) => i.perMetre);
}

/** The readings of the fault among a request's inputs (see `MethodInput.reading`). */
export function readingInputs(method: string): readonly MethodInput[] {
  const def = (METHOD_DEFINITIONS as Record<string, MethodDefinition>)[method];
  return def ? def.inputs.filter((i) => i.reading) : [];
}

// ---------------------------------------------------------------------------------------------
// Which methods fit a fault

/**
 * The four situations the published methods are told apart by: a short between two conductors,
 * a conductor faulted to earth (line C, the earth/guard line, or the piste), an open line, and
 * a high resistance in series on a line; and one that only shows while the cable moves.
 */
export type FaultSituation = 'short' | 'earth' | 'open' | 'high-resistance' | 'intermittent';

export const FAULT_SITUATION_LABELS: Record<FaultSituation, string> = {
  short: 'short between conductors',
  earth: 'fault to earth or piste',
  open: 'open line',
  'high-resistance': 'high resistance',
  intermittent: 'intermittent fault',
};

export function faultSituation(kind: FaultKind, conductors: string): FaultSituation {
  if (conductors.startsWith('piste')) return 'earth';
  if (kind === 'short') return conductors.includes('C') ? 'earth' : 'short';
  return kind;
}

export interface SuggestedMethod {
  method: LocateMethod;
  /** One line: why this method fits this fault, from what the method requires. */
  reason: string;
}

/** In an A–C or B–C fault: the line faulted to C (the Murray loop's faulted line) and the one left sound. */
export function murrayLines(conductors: string): { faulted: string; sound: string } | null {
  const lines = conductors.split('-');
  if (lines.length !== 2 || !lines.includes('C')) return null;
  const faulted = lines.find((l) => l !== 'C')!;
  return { faulted, sound: faulted === 'A' ? 'B' : 'A' };
}

/**
 * The methods that fit, the one to try first first, each with its reason. Each method's
 * requirement decides: the loop methods need a short between two conductors (from one end, a
 * dead one); the Murray loop a conductor faulted to earth and a sound conductor to loop it with;
 * the capacitance ratio an open conductor; TDR an impedance change big enough to reflect; the
 * flex test only hands and the meter.
 */
export function methodsForFault(kind: FaultKind, conductors: string): SuggestedMethod[] {
  const situation = faultSituation(kind, conductors);
  const flexShort = { method: 'flex', reason: 'When the reading jumps as the cable moves, the spot can be found by hand.' } as const;
  if (conductors.startsWith('piste')) {
    return [
      {
        method: 'flex',
        reason:
          'A piste is one conductor with no sound partner to loop or bridge with: measure it section by section and record where the reading changes.',
      },
    ];
  }
  switch (situation) {
    case 'short':
      return [
        {
          method: 'loop-both-ends',
          reason: 'A short between two conductors with both ends within reach: the short’s own resistance drops out of the distance.',
        },
        {
          method: 'loop-one-end',
          reason: 'Needs a dead short: any resistance left in the short is counted as cable and puts the fault further away.',
        },
        { method: 'tdr', reason: 'A low-resistance short reflects a pulse downwards; needs a TDR, or a pulse generator and a scope.' },
        flexShort,
      ];
    case 'earth': {
      const lines = murrayLines(conductors);
      const murrayReason = lines
        ? `Line ${lines.faulted} is faulted to earth (line C) and line ${lines.sound} can be the sound line looped with it: at balance the fault’s own resistance does not enter the distance.`
        : 'A line faulted to earth with a sound line to loop it with: at balance the fault’s own resistance does not enter the distance.';
      return [
        { method: 'murray', reason: murrayReason },
        {
          method: 'loop-both-ends',
          reason: 'The fault to C is still a short between two conductors: from both ends its own resistance drops out.',
        },
        { method: 'loop-one-end', reason: 'Only for a dead short to C: resistance left in the fault is counted as cable.' },
        { method: 'tdr', reason: 'A low-resistance fault to C reflects a pulse downwards; a high-resistance one may not show.' },
        flexShort,
      ];
    }
    case 'open':
      return [
        {
          method: 'capacitance',
          reason:
            'A broken line keeps capacitance only over the part still joined, in proportion to its length; needs a sound line of the same cable to compare.',
        },
        { method: 'tdr', reason: 'An open reflects a pulse upwards at the break; needs a TDR, or a pulse generator and a scope.' },
        { method: 'flex', reason: 'A break that opens and closes as the cable moves is found by hand.' },
      ];
    case 'high-resistance':
      return [
        {
          method: 'flex',
          reason:
            'The line still conducts, so no loop, bridge or capacitance method applies; flex it, plugs first, and the reading changes at the corroded or cracked spot.',
        },
        {
          method: 'tdr',
          reason:
            'A few ohms in series reflect a pulse only weakly upwards (ρ = R / (R + 2Z₀)), so it shows only with a sharp edge and a steady trace.',
        },
      ];
    case 'intermittent':
      return [{ method: 'flex', reason: 'It shows only while the cable moves, so readings taken still would not hold: find it by hand.' }];
  }
}
