// Limit profiles and verdicts. A profile is versioned; callers store the version with each
// verdict so a later edit of the profile never rewrites history.

import { formatOhm, roundSignificant } from './units';

export const EQUIPMENT_KINDS = ['floor-cable', 'reel', 'piste', 'body-wire', 'apparatus', 'other'] as const;
export type EquipmentKind = (typeof EQUIPMENT_KINDS)[number];

export const TEST_KINDS = ['continuity', 'insulation', 'loop', 'piste-end-to-end', 'piste-earth'] as const;
export type TestKind = (typeof TEST_KINDS)[number];

export const CONDUCTORS = ['A', 'B', 'C'] as const;
export type Conductor = (typeof CONDUCTORS)[number];

export const PAIRS = ['A-B', 'A-C', 'B-C'] as const;
export type ConductorPair = (typeof PAIRS)[number];

export type LimitRule = {
  id: string;
  equipmentKind: EquipmentKind;
  testKind: TestKind;
  maxOhm?: number;
  maxOhmPerMetre?: number;
  connectorAllowanceOhm?: number;
  minOhm?: number;
  /** e.g. 0.9: a reading above 90 % of a maximum passes but is near limit. */
  nearLimitFraction?: number;
  /** Insulation: a reading below this passes but is near limit. */
  nearMinOhm?: number;
  source: string;
  houseRule: boolean;
  note?: string;
};

export type LimitProfile = {
  name: string;
  version: number;
  rules: LimitRule[];
  /** Kinds whose checklist includes loop steps. */
  loopRequired?: EquipmentKind[];
  /**
   * Copper readings taken with a cable temperature are corrected to this temperature before they
   * are judged: a house rule, since the FIE Material Rules give no reference temperature. Null
   * or absent (the default): readings are judged as measured.
   */
  temperatureReferenceC?: number | null | undefined;
};

export type Verdict = {
  verdict: 'pass' | 'near-limit' | 'fail';
  limitOhm: number | null;
  limitKind: 'max' | 'min' | null;
  source: string;
  ruleId: string | null;
  explanation: string;
  /** The reading corrected to the profile's reference temperature, when it has one and a temperature was given. */
  correctedOhm?: number;
};

export const HOUSE_RULE_SOURCE = 'House rule (no published value)';
const NEAR_LIMIT_FRACTION = 0.9;
const INSULATION_MIN_OHM = 100e3;
const INSULATION_NEAR_MIN_OHM = 1e6;
/** FIE Material Rules, Annex B: a valid foil hit always registers below 500 Ω. */
export const APPARATUS_REGISTERS_BELOW_OHM = 500;

const NEAR_NOTE = 'Near limit above 90 % of the maximum: house rule.';
const INSULATION_NOTE =
  'FIE Material Rules, art. m.29.1a and m.31.1a ask for conductors to be "well insulated" without a value. Fail below 100 kΩ, near limit below 1 MΩ; over range (OL) passes.';

function insulationRule(kind: EquipmentKind): LimitRule {
  return {
    id: `${kind}.insulation`,
    equipmentKind: kind,
    testKind: 'insulation',
    minOhm: INSULATION_MIN_OHM,
    nearMinOhm: INSULATION_NEAR_MIN_OHM,
    source: HOUSE_RULE_SOURCE,
    houseRule: true,
    note: INSULATION_NOTE,
  };
}

function loopRule(kind: EquipmentKind, perWireMaxOhm: number, article: string): LimitRule {
  return {
    id: `${kind}.loop`,
    equipmentKind: kind,
    testKind: 'loop',
    maxOhm: 2 * perWireMaxOhm,
    nearLimitFraction: NEAR_LIMIT_FRACTION,
    source: HOUSE_RULE_SOURCE,
    houseRule: true,
    note: `Two wires in series: twice the ${formatOhm(perWireMaxOhm)} per-wire limit of FIE Material Rules, art. ${article}. ${NEAR_NOTE}`,
  };
}

/**
 * The default profile, from the FIE Material Rules (edition of 2026). The TD can copy and edit
 * it; published values keep their article, our own choices say "House rule".
 */
export const DEFAULT_LIMIT_PROFILE: LimitProfile = {
  name: 'Competition default',
  version: 1,
  loopRequired: ['floor-cable', 'reel'],
  // The rules give no reference temperature, so readings are judged as measured.
  temperatureReferenceC: null,
  rules: [
    {
      id: 'floor-cable.continuity',
      equipmentKind: 'floor-cable',
      testKind: 'continuity',
      maxOhm: 2.5,
      nearLimitFraction: NEAR_LIMIT_FRACTION,
      source: 'FIE Material Rules, art. m.55.5',
      houseRule: false,
      note: `All three wires of the cables connecting reel to apparatus. ${NEAR_NOTE}`,
    },
    insulationRule('floor-cable'),
    loopRule('floor-cable', 2.5, 'm.55.5'),
    {
      id: 'reel.continuity',
      equipmentKind: 'reel',
      testKind: 'continuity',
      maxOhm: 3,
      nearLimitFraction: NEAR_LIMIT_FRACTION,
      source: 'FIE Material Rules, art. m.55.1',
      houseRule: false,
      note: `Reel wire, socket to socket. ${NEAR_NOTE}`,
    },
    insulationRule('reel'),
    loopRule('reel', 3, 'm.55.1'),
    {
      id: 'body-wire.continuity',
      equipmentKind: 'body-wire',
      testKind: 'continuity',
      maxOhm: 1,
      nearLimitFraction: NEAR_LIMIT_FRACTION,
      source: 'FIE Material Rules, art. m.29.1c / m.31.1b',
      houseRule: false,
      note: `Foil/sabre body wire plug to plug and plug to clip (m.29.1c); épée body wire plug to plug (m.31.1b). ${NEAR_NOTE}`,
    },
    insulationRule('body-wire'),
    loopRule('body-wire', 1, 'm.29.1c / m.31.1b'),
    {
      id: 'piste.end-to-end',
      equipmentKind: 'piste',
      testKind: 'piste-end-to-end',
      maxOhm: 5,
      nearLimitFraction: NEAR_LIMIT_FRACTION,
      source: 'FIE Material Rules, art. m.57.1',
      houseRule: false,
      note: `Conductive piste, end to end. ${NEAR_NOTE}`,
    },
    {
      id: 'piste.earth',
      equipmentKind: 'piste',
      testKind: 'piste-earth',
      maxOhm: 5,
      nearLimitFraction: NEAR_LIMIT_FRACTION,
      source: HOUSE_RULE_SOURCE,
      houseRule: true,
      note: `FIE Material Rules, art. m.56.4 requires the piste to be earthed at its centre but gives no value; measured from the piste to the apparatus earth. ${NEAR_NOTE}`,
    },
    // A piste is one conductor, so it has no insulation between conductors.
    insulationRule('apparatus'),
    insulationRule('other'),
  ],
};

export class NoRuleError extends Error {
  readonly code = 'no-limit-rule';
  readonly profileName: string;
  readonly profileVersion: number;
  readonly equipmentKind: string;
  readonly testKind: string;
  constructor(profileName: string, profileVersion: number, equipmentKind: string, testKind: string) {
    super(
      `The limit profile “${profileName}” (version ${profileVersion}) has no ${testKind} rule for ${kindLabel(equipmentKind)}; add one to the profile or take this test off the checklist.`,
    );
    this.name = 'NoRuleError';
    this.profileName = profileName;
    this.profileVersion = profileVersion;
    this.equipmentKind = equipmentKind;
    this.testKind = testKind;
  }
}

/** A reading or its context that cannot be judged (wrong conductor names, missing length…). */
export class ReadingInputError extends Error {
  readonly code = 'invalid-reading';
  readonly field: string;
  constructor(field: string, message: string) {
    super(message);
    this.name = 'ReadingInputError';
    this.field = field;
  }
}

export function findRule(profile: LimitProfile, equipmentKind: EquipmentKind, testKind: TestKind): LimitRule | null {
  return profile.rules.find((r) => r.equipmentKind === equipmentKind && r.testKind === testKind) ?? null;
}

/**
 * IEC 60228 Annex B, copper: k_t = 254.5 / (234.5 + t) multiplies a reading at t °C to give it
 * at 20 °C; to another reference T the same law gives (234.5 + T) / (234.5 + t).
 */
export function temperatureCorrectionFactor(temperatureC: number, referenceC = 20): number {
  if (!Number.isFinite(temperatureC) || temperatureC <= -234.5) {
    throw new RangeError(`A conductor temperature of ${temperatureC} °C is not physical.`);
  }
  return (234.5 + referenceC) / (234.5 + temperatureC);
}

export function correctTo20C(resistanceOhm: number, temperatureC: number): number {
  return resistanceOhm * temperatureCorrectionFactor(temperatureC);
}

/** How the profile treats a cable's temperature, in a few words, as a certificate prints it. */
export function temperatureRuleText(profile: Pick<LimitProfile, 'temperatureReferenceC'>): string {
  const referenceC = profile.temperatureReferenceC;
  if (referenceC === null || referenceC === undefined) return 'Judged as measured (no correction)';
  return `Copper corrected to ${referenceC} °C (IEC 60228 Annex B): house rule`;
}

/** Indoor venues; outside this the thermometer reading is a typo. */
export const TEMPERATURE_RANGE_C = { min: -40, max: 70 } as const;

const KIND_LABEL: Record<EquipmentKind, string> = {
  'floor-cable': 'floor cables',
  reel: 'reels',
  piste: 'pistes',
  'body-wire': 'body wires',
  apparatus: 'scoring apparatus',
  other: 'other equipment',
};

function kindLabel(kind: string): string {
  return KIND_LABEL[kind as EquipmentKind] ?? kind;
}

const MAX_PHRASE: Record<TestKind, string> = {
  continuity: 'limit per wire',
  insulation: 'limit',
  loop: 'loop limit (two wires in series)',
  'piste-end-to-end': 'end-to-end limit',
  'piste-earth': 'limit from piste to apparatus earth',
};

/** `A`, `b ` → `A`; `b-a`, `A–B`, `AB`, `A/B` → `A-B`. Null when not one conductor / one pair. */
export function normaliseConductors(text: string, expect: 'single' | 'pair'): Conductor | ConductorPair | null {
  const letters = text.toUpperCase().replace(/[\s\-–—/]/g, '');
  if (!/^[ABC]+$/.test(letters)) return null;
  if (expect === 'single') return letters.length === 1 ? (letters as Conductor) : null;
  if (letters.length !== 2 || letters[0] === letters[1]) return null;
  return [...letters].sort().join('-') as ConductorPair;
}

const SINGLE_CONDUCTOR_TESTS: ReadonlySet<TestKind> = new Set(['continuity']);
const PAIR_TESTS: ReadonlySet<TestKind> = new Set(['insulation', 'loop']);
// Copper conductors only: a piste is steel or aluminium, with another temperature coefficient.
const TEMPERATURE_CORRECTED_TESTS: ReadonlySet<TestKind> = new Set(['continuity', 'loop']);

export type ReadingToEvaluate = {
  profile: LimitProfile;
  equipmentKind: EquipmentKind;
  testKind: TestKind;
  /** `A`, `B`, `C` for continuity; `A-B`, `A-C`, `B-C` for insulation and loop; ignored on pistes. */
  conductors: string;
  valueOhm: number | null;
  overRange: boolean;
  lengthM?: number | null | undefined;
  temperatureC?: number | null | undefined;
};

export function evaluateReading(input: ReadingToEvaluate): Verdict {
  const { profile, equipmentKind, testKind } = input;
  const conductors = checkConductors(testKind, input.conductors);
  const rule = findRule(profile, equipmentKind, testKind);
  if (!rule) throw new NoRuleError(profile.name, profile.version, equipmentKind, testKind);

  if (!input.overRange) {
    if (input.valueOhm === null || !Number.isFinite(input.valueOhm) || input.valueOhm < 0) {
      throw new ReadingInputError('valueOhm', 'A reading must be a resistance of 0 Ω or more, or over range (OL).');
    }
  }
  if (rule.minOhm !== undefined && rule.maxOhm === undefined && rule.maxOhmPerMetre === undefined) {
    return evaluateMinimum(rule, input, conductors);
  }
  return evaluateMaximum(rule, input, conductors);
}

function checkConductors(testKind: TestKind, text: string): string {
  if (SINGLE_CONDUCTOR_TESTS.has(testKind)) {
    const single = normaliseConductors(text ?? '', 'single');
    if (!single) {
      throw new ReadingInputError('conductors', `A ${testKind} reading is for one conductor: A, B or C (got “${text}”).`);
    }
    return single;
  }
  if (PAIR_TESTS.has(testKind)) {
    const pair = normaliseConductors(text ?? '', 'pair');
    if (!pair) {
      throw new ReadingInputError('conductors', `A ${testKind} reading is for a pair: A-B, A-C or B-C (got “${text}”).`);
    }
    return pair;
  }
  return '';
}

function evaluateMaximum(rule: LimitRule, input: ReadingToEvaluate, conductors: string): Verdict {
  const { limitOhm, limitNote } = maximumFor(rule, input.lengthM ?? null, input.equipmentKind);
  const what = `the ${formatOhm(limitOhm)} ${MAX_PHRASE[input.testKind]} for ${kindLabel(input.equipmentKind)}`;
  const base = { limitOhm, limitKind: 'max' as const, source: rule.source, ruleId: rule.id };

  if (input.overRange) {
    const open =
      input.testKind === 'loop'
        ? `Over range (OL): the loop ${conductors} is open — one of the two conductors is broken, or the far end is not bridged`
        : input.testKind === 'piste-earth'
          ? 'Over range (OL): the piste is not connected to the apparatus earth'
          : input.testKind === 'piste-end-to-end'
            ? 'Over range (OL): no connection from one end of the piste to the other'
            : `Over range (OL): conductor ${conductors} is open — there is no connection from end to end`;
    return { ...base, verdict: 'fail', explanation: `${open}. It fails ${what}${limitNote} — ${rule.source}.` };
  }

  const readOhm = input.valueOhm as number;
  let comparedOhm = readOhm;
  let prefix = '';
  let correctedOhm: number | undefined;
  const temperatureC = input.temperatureC ?? null;
  if (temperatureC !== null && TEMPERATURE_CORRECTED_TESTS.has(input.testKind)) {
    if (!Number.isFinite(temperatureC) || temperatureC < TEMPERATURE_RANGE_C.min || temperatureC > TEMPERATURE_RANGE_C.max) {
      throw new ReadingInputError(
        'temperatureC',
        `The cable temperature must be between ${TEMPERATURE_RANGE_C.min} and ${TEMPERATURE_RANGE_C.max} °C (got ${temperatureC}).`,
      );
    }
    const referenceC = input.profile.temperatureReferenceC;
    if (referenceC === null || referenceC === undefined) {
      prefix = `Read ${formatOhm(readOhm)} at ${temperatureC} °C and judged as measured (the FIE Material Rules give no reference temperature). `;
    } else {
      correctedOhm = roundSignificant(readOhm * temperatureCorrectionFactor(temperatureC, referenceC), 12);
      comparedOhm = correctedOhm;
      prefix = `Read ${formatOhm(readOhm)} at ${temperatureC} °C, which is ${formatOhm(correctedOhm)} corrected to ${referenceC} °C (house rule of this profile, the FIE Material Rules give none; IEC 60228 Annex B, copper). `;
    }
  }

  const value = formatOhm(comparedOhm);
  const fraction = rule.nearLimitFraction;
  let verdict: Verdict['verdict'];
  let sentence: string;
  if (comparedOhm > limitOhm) {
    verdict = 'fail';
    sentence = `${value} is over ${what}${limitNote} — ${rule.source}.`;
  } else if (fraction !== undefined && comparedOhm > fraction * limitOhm) {
    verdict = 'near-limit';
    sentence = `${value} is within ${what}${limitNote} but above ${Math.round(fraction * 100)} % of it: near limit, it passes but should be watched — ${rule.source}.`;
  } else {
    verdict = 'pass';
    sentence = `${value} is within ${what}${limitNote} — ${rule.source}.`;
  }
  const verdictOut: Verdict = { ...base, verdict, explanation: prefix + sentence };
  if (correctedOhm !== undefined) verdictOut.correctedOhm = correctedOhm;
  return verdictOut;
}

function maximumFor(rule: LimitRule, lengthM: number | null, kind: EquipmentKind): { limitOhm: number; limitNote: string } {
  if (rule.maxOhmPerMetre === undefined) {
    if (rule.maxOhm === undefined) {
      throw new ReadingInputError('profile', `Rule ${rule.id} has no maximum; fix the limit profile.`);
    }
    return { limitOhm: rule.maxOhm, limitNote: '' };
  }
  if (lengthM === null || !Number.isFinite(lengthM) || lengthM <= 0) {
    if (rule.maxOhm !== undefined) return { limitOhm: rule.maxOhm, limitNote: ' (length unknown, so the absolute maximum applies)' };
    throw new ReadingInputError(
      'lengthM',
      `The limit for ${kindLabel(kind)} is per metre (rule ${rule.id}), so the item's length is needed; record it in the equipment register.`,
    );
  }
  const allowanceOhm = rule.connectorAllowanceOhm ?? 0;
  const perMetreLimitOhm = roundSignificant(rule.maxOhmPerMetre * lengthM + allowanceOhm, 12);
  const how = `${formatOhm(rule.maxOhmPerMetre)}/m × ${roundSignificant(lengthM, 6)} m${allowanceOhm > 0 ? ` + ${formatOhm(allowanceOhm)} for the connectors` : ''}`;
  // When both are set, the stricter applies: the absolute maximum caps a long item.
  if (rule.maxOhm !== undefined && rule.maxOhm < perMetreLimitOhm) {
    return { limitOhm: rule.maxOhm, limitNote: ` (the absolute maximum, stricter than ${how} = ${formatOhm(perMetreLimitOhm)})` };
  }
  return { limitOhm: perMetreLimitOhm, limitNote: ` (${how})` };
}

function evaluateMinimum(rule: LimitRule, input: ReadingToEvaluate, conductors: string): Verdict {
  const minOhm = rule.minOhm as number;
  const pair = conductors ? `between ${conductors.replace('-', ' and ')} ` : '';
  const what = `the ${formatOhm(minOhm)} minimum insulation for ${kindLabel(input.equipmentKind)}`;
  const base = { limitOhm: minOhm, limitKind: 'min' as const, source: rule.source, ruleId: rule.id };

  if (input.overRange) {
    return {
      ...base,
      verdict: 'pass',
      explanation: `Over range (OL) ${pair}means no measurable leakage: it passes ${what} — ${rule.source}.`,
    };
  }
  const readOhm = input.valueOhm as number;
  const value = `${formatOhm(readOhm)} ${pair}`;
  if (readOhm < minOhm) {
    const hit =
      readOhm < APPARATUS_REGISTERS_BELOW_OHM
        ? ` Below ${APPARATUS_REGISTERS_BELOW_OHM} Ω a leak like this can make the scoring apparatus register a hit (FIE Material Rules, Annex B: a valid foil hit always registers below 500 Ω, and an épée apparatus must register through 100 Ω).`
        : '';
    return { ...base, verdict: 'fail', explanation: `${value}is below ${what} — ${rule.source}.${hit}` };
  }
  if (rule.nearMinOhm !== undefined && readOhm < rule.nearMinOhm) {
    return {
      ...base,
      verdict: 'near-limit',
      explanation: `${value}is above ${what} but below ${formatOhm(rule.nearMinOhm)}: near limit, it passes but should be watched — ${rule.source}.`,
    };
  }
  return { ...base, verdict: 'pass', explanation: `${value}is above ${what} — ${rule.source}.` };
}
