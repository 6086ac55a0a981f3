// Fault location: the trade's published methods, each a pure function returning an estimate
// with an uncertainty band. Distances are from the end the technician measured at ("near end").
//
// Uncertainty convention: each band is a ± half-width; independent contributions (meter
// accuracy, velocity factor, rise time…) are combined root-sum-square. A distance outside the
// cable is refused, never clamped; one that lies past an end by no more than its own band is
// accepted, because the fault is then at that end within what the readings can tell.

import type { FaultLocationRequest } from '../schemas/fault-location';
import { formatLength, formatOhm, METRES_PER_FOOT, roundSignificant, type LengthSystem } from './units';

/** Exact, by the SI definition of the metre. */
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458;

export type FaultEstimate = {
  method: string;
  distanceM: number;
  fromOtherEndM?: number | undefined;
  uncertaintyM: number;
  faultOhm?: number | undefined;
  velocityFactor?: number | undefined;
  explanation: string;
  inputs: Record<string, number>;
};

export type FaultLocationAnswer = Omit<FaultEstimate, 'inputs'>;

export class FaultLocationError extends Error {
  readonly code = 'fault-location-refused';
  /** The input that is invalid or inconsistent, named as in the request. */
  readonly field: string;
  constructor(field: string, message: string) {
    super(message);
    this.name = 'FaultLocationError';
    this.field = field;
  }
}

// ---------------------------------------------------------------------------------------------
// Meter accuracy

/** A handheld meter's ±(percent of reading + digits) specification. */
export type MeterAccuracy = { percentOfReading: number; digits: number; resolutionOhm: number };

/**
 * ±(1 % + 2 digits) at 0.01 Ω resolution: a typical handheld meter on its 200 Ω range (common
 * practice, from memory; use the meter's data sheet when known).
 */
export const DEFAULT_METER_ACCURACY: MeterAccuracy = { percentOfReading: 1, digits: 2, resolutionOhm: 0.01 };

export function meterUncertaintyOhm(readingOhm: number, accuracy: MeterAccuracy = DEFAULT_METER_ACCURACY): number {
  return (Math.abs(readingOhm) * accuracy.percentOfReading) / 100 + accuracy.digits * accuracy.resolutionOhm;
}

/** Capacitance ranges of handheld meters are about ±3 % of reading (common practice). */
export const DEFAULT_CAPACITANCE_ACCURACY_FRACTION = 0.03;

/**
 * Ω/m taken from a table (IEC 60228 gives maxima; real conductors are somewhat lower) is
 * trusted to ±5 % (common practice). A cable's own end-to-end reading is better.
 */
export const DEFAULT_OHM_PER_METRE_REL_UNCERTAINTY = 0.05;

/** Without a calibration on this cable type, a velocity factor is trusted to ±3 % (common practice). */
export const DEFAULT_VELOCITY_FACTOR_REL_UNCERTAINTY = 0.03;

/** After calibration on a known-good cable, ±1 % remains from cable-to-cable spread (common practice). */
export const CALIBRATED_VELOCITY_FACTOR_REL_UNCERTAINTY = 0.01;

/** A bridge balance is read to about ±1 % of the ratio (common practice). */
export const DEFAULT_RATIO_REL_UNCERTAINTY = 0.01;

/** Flexing the cable by hand finds a crack to about a hand's width (common practice). */
export const DEFAULT_FLEX_TEST_UNCERTAINTY_M = 0.1;

/** No ordinary cable is slower than this; a lower value is a wrong marker or a wrong length. */
export const MIN_VELOCITY_FACTOR = 0.3;

/**
 * Without a cable length nothing bounds a result, so one longer than the longest cable these
 * methods are meant for is refused as a typo: floor cables, reels and pistes are tens of metres,
 * and 2 km leaves room for long runs (common practice). The server takes its own setting.
 */
export const DEFAULT_MAX_CABLE_LENGTH_M = 2000;

export type LocateOptions = {
  /** The longest result accepted when no cable length is given. */
  maxCableLengthM?: number | undefined;
};

// ---------------------------------------------------------------------------------------------
// Small helpers

function requirePositive(field: string, value: unknown, what: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new FaultLocationError(field, `${field} must be ${what} greater than 0 (got ${String(value)}).`);
  }
  return value;
}

function requireNonNegative(field: string, value: unknown, what: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
    throw new FaultLocationError(field, `${field} must be ${what} of 0 or more (got ${String(value)}).`);
  }
  return value;
}

function num(value: number, digits = 4): string {
  return String(roundSignificant(value, digits));
}

/**
 * How lengths are worded for the reader: metres, or feet at exactly 0.3048 m. The numbers stay
 * in metres throughout; only the sentences change.
 */
function lengthWords(units: LengthSystem) {
  const imperial = units === 'imperial';
  const metresPerUnit = imperial ? METRES_PER_FOOT : 1;
  const m = (lengthM: number): string => formatLength(lengthM, units);
  const pm = (uncertaintyM: number): string => `±${formatLength(uncertaintyM, units)}`;
  return {
    m,
    pm,
    /** "about 7.4 m from the near end (4.6 m from the far end), ±0.3 m" */
    where(distanceM: number, uncertaintyM: number, lengthM: number | undefined, nearEnd = 'the near end'): string {
      const far = lengthM === undefined ? '' : ` (${m(lengthM - distanceM)} from the far end)`;
      return `about ${m(distanceM)} from ${nearEnd}${far}, ${pm(uncertaintyM)}`;
    },
    /** A speed: "0.198 m per ns", "0.649 ft per ns". */
    perNs: (metresPerNs: number): string => `${num(metresPerNs / metresPerUnit, 3)} ${imperial ? 'ft' : 'm'} per ns`,
    /** Something per metre (a delay in ns) as a number per metre or per foot. */
    perLength: (valuePerMetre: number, digits = 4): string => num(valuePerMetre * metresPerUnit, digits),
    /** "metre" or "foot", for "ns per metre". */
    unitName: imperial ? 'foot' : 'metre',
    /**
     * A conductor's resistance per length: "0.0375 Ω/m", or per 1000 ft in feet ("11.43 Ω/1000 ft"),
     * as the forms take it and as wire tables give it (per foot is a tiny number).
     */
    ohmPerLength: (ohmPerMetre: number): string =>
      imperial ? `${num(ohmPerMetre * metresPerUnit * 1000)} Ω/1000 ft` : `${num(ohmPerMetre)} Ω/m`,
    /** "Ω per metre" or "Ω per 1000 ft", for advice sentences. */
    ohmPerWords: imperial ? 'Ω per 1000 ft' : 'Ω per metre',
  };
}

type LengthWords = ReturnType<typeof lengthWords>;

/**
 * Refuses a distance outside 0…L unless it is within its own uncertainty of an end; then
 * returns a sentence saying so (empty when well inside).
 */
function checkInsideCable(
  distanceM: number,
  uncertaintyM: number,
  lengthM: number | undefined,
  field: string,
  cause: string,
  f: LengthWords,
): string {
  const { m, pm } = f;
  if (distanceM < -uncertaintyM) {
    throw new FaultLocationError(
      field,
      `These readings put the fault ${m(-distanceM)} before the near end, which is outside the cable even allowing ${pm(uncertaintyM)}. ${cause}`,
    );
  }
  if (lengthM !== undefined && distanceM > lengthM + uncertaintyM) {
    throw new FaultLocationError(
      field,
      `These readings put the fault at ${m(distanceM)}, beyond the end of this ${m(lengthM)} cable even allowing ${pm(uncertaintyM)}. ${cause}`,
    );
  }
  if (distanceM < 0) {
    return ' The estimate falls just before the near end but within its uncertainty: the fault is at or next to the near-end connector.';
  }
  if (lengthM !== undefined && distanceM > lengthM) {
    return ' The estimate falls just past the far end but within its uncertainty: the fault is at or next to the far-end connector.';
  }
  return '';
}

/** With no length to check against, a result beyond any cable these methods are meant for is refused. */
function checkPlausible(
  distanceM: number,
  lengthM: number | undefined,
  field: string,
  options: LocateOptions | undefined,
  f: LengthWords,
): void {
  const maxM = options?.maxCableLengthM ?? DEFAULT_MAX_CABLE_LENGTH_M;
  if (lengthM === undefined && distanceM > maxM) {
    throw new FaultLocationError(
      field,
      `These readings put the fault ${f.m(distanceM)} away, further than the longest cable these methods are meant for (${f.m(maxM)}). Check the reading for a missing decimal point or a wrong prefix, or give the cable length.`,
    );
  }
}

function withLength(estimate: Omit<FaultEstimate, 'fromOtherEndM'>, lengthM: number | undefined): FaultEstimate {
  if (lengthM === undefined) return estimate;
  return { ...estimate, fromOtherEndM: lengthM - estimate.distanceM };
}

function inputsOf(values: Record<string, number | undefined>): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [key, value] of Object.entries(values)) if (value !== undefined) out[key] = value;
  return out;
}

// ---------------------------------------------------------------------------------------------
// TDR

/** One-way propagation delay in ns per metre: 1 / (VF · c). */
export function delayNsPerMetre(velocityFactor: number): number {
  return 1e9 / (velocityFactor * SPEED_OF_LIGHT_M_PER_S);
}

/** VF = 1 / √εr for a non-magnetic dielectric. */
export function velocityFactorFromPermittivity(relativePermittivity: number): number {
  if (!Number.isFinite(relativePermittivity) || relativePermittivity < 1) {
    throw new FaultLocationError('relativePermittivity', 'A relative permittivity is 1 (vacuum) or more.');
  }
  return 1 / Math.sqrt(relativePermittivity);
}

/** ρ = (Z_L − Z_0) / (Z_L + Z_0); an open is +1, a short −1. */
export function reflectionCoefficient(loadOhm: number, characteristicOhm: number): number {
  if (loadOhm === Infinity) return 1;
  return (loadOhm - characteristicOhm) / (loadOhm + characteristicOhm);
}

/** Z_L = Z_0 (1 + ρ) / (1 − ρ); Infinity for an open (ρ = 1). */
export function loadImpedanceFromReflection(rho: number, characteristicOhm: number): number {
  if (rho >= 1) return Infinity;
  return (characteristicOhm * (1 + rho)) / (1 - rho);
}

/** Single-pole rule, 10–90 % rise: BW ≈ 0.35 / t_r (0.35 = ln 9 / 2π). */
export function bandwidthHzForRiseTime(riseTimeS: number): number {
  return 0.35 / riseTimeS;
}

/** Two reflections closer than VF · c · t_r / 2 merge into one edge. */
export function tdrResolutionM(riseTimeNs: number, velocityFactor = 1): number {
  return (velocityFactor * SPEED_OF_LIGHT_M_PER_S * riseTimeNs * 1e-9) / 2;
}

function requireVelocityFactor(field: string, value: unknown): number {
  const vf = requirePositive(field, value, 'a velocity factor');
  if (vf > 1) {
    throw new FaultLocationError(
      field,
      `A velocity factor of ${num(vf)} is impossible: nothing travels faster than light in vacuum (VF ≤ 1).`,
    );
  }
  if (vf < MIN_VELOCITY_FACTOR) {
    throw new FaultLocationError(
      field,
      `A velocity factor of ${num(vf)} is slower than any ordinary cable (${MIN_VELOCITY_FACTOR} or more); calibrate on a known-good cable of the same type.`,
    );
  }
  return vf;
}

export type TdrInput = {
  roundTripNs: number;
  velocityFactor: number;
  /** 10–90 % rise time of the incident edge, for the resolution part of the band. */
  riseTimeNs?: number | undefined;
  lengthM?: number | undefined;
  /** Absolute ± on the velocity factor; default ±3 % of it (uncalibrated). */
  velocityFactorUncertainty?: number | undefined;
};

/**
 * d = VF · c · Δt / 2. The band combines half the rise-time resolution (a single edge's 50 %
 * point is found to within half the distance at which two edges would merge) and the velocity
 * factor's own uncertainty, which scales with the distance.
 */
export function locateByTdr(input: TdrInput, units: LengthSystem = 'metric', options?: LocateOptions): FaultEstimate {
  const f = lengthWords(units);
  const roundTripNs = requirePositive('roundTripNs', input.roundTripNs, 'a round-trip time in ns');
  const vf = requireVelocityFactor('velocityFactor', input.velocityFactor);
  const riseTimeNs = input.riseTimeNs === undefined ? undefined : requireNonNegative('riseTimeNs', input.riseTimeNs, 'a rise time in ns');
  const lengthM = input.lengthM === undefined ? undefined : requirePositive('lengthM', input.lengthM, 'a length in m');
  const vfUncertainty =
    input.velocityFactorUncertainty === undefined
      ? DEFAULT_VELOCITY_FACTOR_REL_UNCERTAINTY * vf
      : requireNonNegative('velocityFactorUncertainty', input.velocityFactorUncertainty, 'a velocity-factor uncertainty');
  if (vfUncertainty >= vf) {
    throw new FaultLocationError(
      'velocityFactorUncertainty',
      'The velocity-factor uncertainty must be smaller than the velocity factor itself.',
    );
  }

  const distanceM = (vf * SPEED_OF_LIGHT_M_PER_S * roundTripNs * 1e-9) / 2;
  const resolutionM = riseTimeNs === undefined ? 0 : tdrResolutionM(riseTimeNs, vf);
  const timingM = resolutionM / 2;
  const vfPartM = (distanceM * vfUncertainty) / vf;
  const uncertaintyM = Math.hypot(timingM, vfPartM);
  checkPlausible(distanceM, lengthM, 'roundTripNs', options, f);

  const edgeNote = checkInsideCable(
    distanceM,
    uncertaintyM,
    lengthM,
    'roundTripNs',
    'The reflection marker is probably on a reflection from beyond the far end (or a second bounce), or the velocity factor is wrong; check the markers and calibrate the velocity factor on a known-good cable.',
    f,
  );
  const parts = [
    riseTimeNs === undefined
      ? 'rise time not given, so the band covers the velocity factor only'
      : `${f.pm(timingM)} from the ${num(riseTimeNs, 3)} ns rise time (half its ${f.m(resolutionM)} resolution)`,
    `${f.pm(vfPartM)} from the velocity factor (±${num(vfUncertainty, 2)})`,
  ];
  const explanation =
    `The reflection comes back ${num(roundTripNs)} ns after the incident edge. At a velocity factor of ${num(vf, 3)} ` +
    `the signal travels ${f.perNs(1 / delayNsPerMetre(vf))}; it went to the fault and back, so the fault is ${f.where(distanceM, uncertaintyM, lengthM, 'the instrument end')} ` +
    `(${parts.join('; ')}).${edgeNote}`;

  return withLength(
    {
      method: 'tdr',
      distanceM,
      uncertaintyM,
      velocityFactor: vf,
      explanation,
      inputs: inputsOf({ roundTripNs, velocityFactor: vf, riseTimeNs, lengthM, velocityFactorUncertainty: vfUncertainty }),
    },
    lengthM,
  );
}

export type VelocityFactorCalibration = {
  velocityFactor: number;
  velocityFactorUncertainty: number;
  /** One-way delay, ns per metre. */
  delayNsPerMetre: number;
  explanation: string;
  inputs: Record<string, number>;
};

/** VF = 2L / (c · Δt), on a known-good cable whose far end is open (or shorted). */
export function calibrateVelocityFactor(
  input: {
    roundTripNs: number;
    lengthM: number;
    riseTimeNs?: number | undefined;
  },
  units: LengthSystem = 'metric',
): VelocityFactorCalibration {
  const f = lengthWords(units);
  const roundTripNs = requirePositive('roundTripNs', input.roundTripNs, 'a round-trip time in ns');
  const lengthM = requirePositive('lengthM', input.lengthM, 'a length in m');
  const riseTimeNs = input.riseTimeNs === undefined ? undefined : requireNonNegative('riseTimeNs', input.riseTimeNs, 'a rise time in ns');
  const vf = (2 * lengthM) / (SPEED_OF_LIGHT_M_PER_S * roundTripNs * 1e-9);
  // The 1e-9 slack only absorbs floating-point rounding at exactly VF = 1 or 0.3.
  if (vf > 1 + 1e-9) {
    throw new FaultLocationError(
      'roundTripNs',
      `${num(roundTripNs)} ns is less than light needs to go ${f.m(lengthM)} and back (velocity factor ${num(vf, 3)} > 1). Check the cable length, or whether the reflection marker sits on the far-end reflection.`,
    );
  }
  if (vf < MIN_VELOCITY_FACTOR - 1e-9) {
    throw new FaultLocationError(
      'roundTripNs',
      `${num(roundTripNs)} ns over ${f.m(lengthM)} gives a velocity factor of ${num(vf, 3)}, slower than any ordinary cable. The marker is probably on a second bounce, or the length is wrong.`,
    );
  }
  const timingRel = riseTimeNs === undefined ? 0 : riseTimeNs / 2 / roundTripNs;
  const velocityFactorUncertainty = vf * Math.max(timingRel, CALIBRATED_VELOCITY_FACTOR_REL_UNCERTAINTY);
  return {
    velocityFactor: vf,
    velocityFactorUncertainty,
    delayNsPerMetre: delayNsPerMetre(vf),
    explanation:
      `A known-good ${f.m(lengthM)} cable returns its far-end reflection after ${num(roundTripNs)} ns, so signals travel at ` +
      `${num(vf, 3)} × the speed of light in it (velocity factor ${num(vf, 3)} ±${num(velocityFactorUncertainty, 2)}, ` +
      `${f.perLength(delayNsPerMetre(vf), 4)} ns per ${f.unitName} one way). Use it for cables of the same type.`,
    inputs: inputsOf({ roundTripNs, lengthM, riseTimeNs }),
  };
}

// ---------------------------------------------------------------------------------------------
// Resistance methods

type PerMetreSource = {
  ohmPerMetre: number;
  relUncertainty: number;
  sentence: string;
};

function perMetre(
  ohmPerMetre: number | undefined,
  conductorOhm: number | undefined,
  lengthM: number | undefined,
  accuracy: MeterAccuracy,
  tableRel: number,
  f: LengthWords,
): PerMetreSource {
  if (ohmPerMetre !== undefined && conductorOhm !== undefined) {
    throw new FaultLocationError('ohmPerMetre', 'Give either ohmPerMetre or conductorOhm (with lengthM), not both.');
  }
  if (ohmPerMetre !== undefined) {
    const r = requirePositive('ohmPerMetre', ohmPerMetre, 'a resistance per metre in Ω/m');
    return { ohmPerMetre: r, relUncertainty: tableRel, sentence: `${f.ohmPerLength(r)} per conductor` };
  }
  if (conductorOhm !== undefined) {
    const c = requirePositive('conductorOhm', conductorOhm, 'a conductor resistance in Ω');
    if (lengthM === undefined) {
      throw new FaultLocationError('lengthM', `lengthM is needed to turn the end-to-end conductor reading into ${f.ohmPerWords}.`);
    }
    return {
      ohmPerMetre: c / lengthM,
      relUncertainty: meterUncertaintyOhm(c, accuracy) / c,
      sentence: `${f.ohmPerLength(c / lengthM)} per conductor (a sound conductor reads ${formatOhm(c)} over ${f.m(lengthM)})`,
    };
  }
  throw new FaultLocationError('ohmPerMetre', 'Give ohmPerMetre, or conductorOhm (a sound conductor end to end) with lengthM.');
}

export type LoopOneEndInput = {
  /** Reading between the two shorted conductors at the near end, far end open. */
  loopOhm: number;
  ohmPerMetre?: number | undefined;
  /** End-to-end reading of one sound conductor of the same cable. */
  conductorOhm?: number | undefined;
  lengthM?: number | undefined;
  /** The short's own resistance, when known; 0 assumed. */
  faultOhm?: number | undefined;
  meterAccuracy?: MeterAccuracy | undefined;
  ohmPerMetreRelUncertainty?: number | undefined;
};

/** R_loop = 2 r d + R_f → d = (R_loop − R_f) / (2r). */
export function locateByLoopOneEnd(input: LoopOneEndInput, units: LengthSystem = 'metric', options?: LocateOptions): FaultEstimate {
  const f = lengthWords(units);
  const accuracy = input.meterAccuracy ?? DEFAULT_METER_ACCURACY;
  const loopOhm = requireNonNegative('loopOhm', input.loopOhm, 'a loop resistance in Ω');
  const lengthM = input.lengthM === undefined ? undefined : requirePositive('lengthM', input.lengthM, 'a length in m');
  const faultOhm = input.faultOhm === undefined ? undefined : requireNonNegative('faultOhm', input.faultOhm, 'a resistance in Ω');
  const r = perMetre(
    input.ohmPerMetre,
    input.conductorOhm,
    lengthM,
    accuracy,
    input.ohmPerMetreRelUncertainty ?? DEFAULT_OHM_PER_METRE_REL_UNCERTAINTY,
    f,
  );
  const rf = faultOhm ?? 0;
  if (rf > loopOhm + meterUncertaintyOhm(loopOhm, accuracy)) {
    throw new FaultLocationError(
      'faultOhm',
      `The fault's own resistance (${formatOhm(rf)}) is more than the loop reading (${formatOhm(loopOhm)}); the loop runs through the fault, so it can only be larger.`,
    );
  }
  const distanceM = (loopOhm - rf) / (2 * r.ohmPerMetre);
  const loopPartM = meterUncertaintyOhm(loopOhm, accuracy) / (2 * r.ohmPerMetre);
  const faultPartM = faultOhm === undefined ? 0 : meterUncertaintyOhm(faultOhm, accuracy) / (2 * r.ohmPerMetre);
  const uncertaintyM = Math.hypot(loopPartM, faultPartM, distanceM * r.relUncertainty);
  checkPlausible(distanceM, lengthM, 'loopOhm', options, f);
  const wholeLoop = lengthM === undefined ? '' : ` (the whole cable's loop would be ${formatOhm(2 * r.ohmPerMetre * lengthM)})`;
  const edgeNote = checkInsideCable(
    distanceM,
    uncertaintyM,
    lengthM,
    'loopOhm',
    `The loop reading is larger than the whole cable's loop${wholeLoop}: check that the far end is open (not bridged), that the pair is the shorted one, and the ${f.ohmPerWords}.`,
    f,
  );
  const faultSentence =
    faultOhm === undefined
      ? ' This assumes the short itself has negligible resistance; if it has some, the fault is nearer than this — measure from both ends to remove it.'
      : ` The short's own ${formatOhm(faultOhm)} has been taken off.`;
  return withLength(
    {
      method: 'loop-one-end',
      distanceM,
      uncertaintyM,
      ...(faultOhm === undefined ? {} : { faultOhm }),
      explanation:
        `The loop through the short reads ${formatOhm(loopOhm)}. At ${r.sentence}, the current goes to the short and back on two conductors, ` +
        `so the short is ${f.where(distanceM, uncertaintyM, lengthM)}.${faultSentence}${edgeNote}`,
      inputs: inputsOf({
        loopOhm,
        ohmPerMetre: input.ohmPerMetre,
        conductorOhm: input.conductorOhm,
        lengthM,
        faultOhm,
      }),
    },
    lengthM,
  );
}

export type LoopBothEndsInput = {
  /** Loop reading of the shorted pair from the near end (far end open). */
  nearOhm: number;
  /** Loop reading of the same pair from the far end (near end open). */
  farOhm: number;
  lengthM: number;
  ohmPerMetre?: number | undefined;
  conductorOhm?: number | undefined;
  meterAccuracy?: MeterAccuracy | undefined;
  ohmPerMetreRelUncertainty?: number | undefined;
};

/**
 * R_A = 2 r x + R_f and R_B = 2 r (L − x) + R_f, so x = (R_A − R_B + 2 r L) / (4 r) and
 * R_f = (R_A + R_B) / 2 − r L: the fault's own resistance drops out.
 */
export function locateByLoopBothEnds(input: LoopBothEndsInput, units: LengthSystem = 'metric'): FaultEstimate {
  const f = lengthWords(units);
  const accuracy = input.meterAccuracy ?? DEFAULT_METER_ACCURACY;
  const nearOhm = requireNonNegative('nearOhm', input.nearOhm, 'a loop resistance in Ω');
  const farOhm = requireNonNegative('farOhm', input.farOhm, 'a loop resistance in Ω');
  const lengthM = requirePositive('lengthM', input.lengthM, 'a length in m');
  const r = perMetre(
    input.ohmPerMetre,
    input.conductorOhm,
    lengthM,
    accuracy,
    input.ohmPerMetreRelUncertainty ?? DEFAULT_OHM_PER_METRE_REL_UNCERTAINTY,
    f,
  );
  const rpm = r.ohmPerMetre;
  const distanceM = (nearOhm - farOhm + 2 * rpm * lengthM) / (4 * rpm);
  const faultOhm = (nearOhm + farOhm) / 2 - rpm * lengthM;

  const sNear = meterUncertaintyOhm(nearOhm, accuracy);
  const sFar = meterUncertaintyOhm(farOhm, accuracy);
  const sR = rpm * r.relUncertainty;
  // ∂x/∂r = −(R_A − R_B) / (4 r²)
  const uncertaintyM = Math.hypot(sNear / (4 * rpm), sFar / (4 * rpm), ((nearOhm - farOhm) / (4 * rpm * rpm)) * sR);
  const faultUncertaintyOhm = Math.hypot(sNear / 2, sFar / 2, lengthM * sR);

  if (faultOhm < -faultUncertaintyOhm) {
    throw new FaultLocationError(
      'farOhm',
      `The two loop readings add up to ${formatOhm(nearOhm + farOhm)}, less than the ${formatOhm(2 * rpm * lengthM)} that the cable's own conductors must show (2 × ${f.ohmPerLength(rpm)} × ${f.m(lengthM)}). These readings are inconsistent: check the length, the ${f.ohmPerWords}, and that both readings are of the same pair with the other end open.`,
    );
  }
  const edgeNote = checkInsideCable(
    distanceM,
    uncertaintyM,
    lengthM,
    'nearOhm',
    `The near and far readings differ by more than the whole cable can explain: check that the same pair was measured from both ends and the ${f.ohmPerWords}.`,
    f,
  );
  const faultText =
    faultOhm < 0
      ? `The short itself is a dead short (computed ${formatOhm(faultOhm)}, which is 0 within the meter's accuracy)`
      : `The short itself is about ${formatOhm(faultOhm)} ±${formatOhm(roundSignificant(faultUncertaintyOhm, 2))}`;
  return {
    method: 'loop-both-ends',
    distanceM,
    fromOtherEndM: lengthM - distanceM,
    uncertaintyM,
    faultOhm,
    explanation:
      `The shorted pair reads ${formatOhm(nearOhm)} from the near end and ${formatOhm(farOhm)} from the far end. At ${r.sentence}, ` +
      `the short is ${f.where(distanceM, uncertaintyM, lengthM)}. ${faultText}; measuring from both ends removes it from the distance.${edgeNote}`,
    inputs: inputsOf({ nearOhm, farOhm, lengthM, ohmPerMetre: input.ohmPerMetre, conductorOhm: input.conductorOhm }),
  };
}

export type MurrayLoopInput = {
  lengthM: number;
  /** The bridge arm joined to the faulted conductor, at balance (any unit: only the ratio counts). */
  faultedArm: number;
  /** The bridge arm joined to the sound conductor, at balance. */
  soundArm: number;
  ratioRelUncertainty?: number | undefined;
};

/**
 * Murray loop: the faulted conductor and a sound one of the same size joined at the far end; at
 * the near end one bridge arm on each, the supply between the arms' junction and the earth (or
 * screen) the fault leaks to, the detector between the two conductors. At balance the arms divide
 * as the loop either side of the fault: a_faulted / a_sound = x / (2L − x), so
 * x = 2L · a_faulted / (a_faulted + a_sound). The fault's own resistance is in the supply's lead
 * and drops out.
 */
export function locateByMurrayLoop(input: MurrayLoopInput, units: LengthSystem = 'metric'): FaultEstimate {
  const f = lengthWords(units);
  const lengthM = requirePositive('lengthM', input.lengthM, 'a length in m');
  const faulted = requirePositive('faultedArm', input.faultedArm, 'a bridge arm value');
  const sound = requirePositive('soundArm', input.soundArm, 'a bridge arm value');
  const eps = requireNonNegative('ratioRelUncertainty', input.ratioRelUncertainty ?? DEFAULT_RATIO_REL_UNCERTAINTY, 'a fraction');
  const k = faulted / sound;
  const distanceM = (2 * lengthM * k) / (1 + k);
  // dx/dk = 2L / (1 + k)², with σ_k = k · ε
  const uncertaintyM = ((2 * lengthM) / (1 + k) ** 2) * k * eps;
  const edgeNote = checkInsideCable(
    distanceM,
    uncertaintyM,
    lengthM,
    'faultedArm',
    'At balance the arm on the faulted line is at most the arm on the sound line (equal puts the fault at the far end). Check that the faulted line is on the faulted arm and the sound line on the other, and that the far-end link is in place.',
    f,
  );
  return {
    method: 'murray',
    distanceM,
    fromOtherEndM: lengthM - distanceM,
    uncertaintyM,
    explanation:
      `The bridge balances with ${num(faulted)} on the faulted line’s arm and ${num(sound)} on the sound line’s arm. With the two lines joined at the far end, the fault is ` +
      `${f.where(distanceM, uncertaintyM, lengthM, 'the bridge end')} (the ratio read to ±${num(eps * 100, 2)} %).${edgeNote}`,
    inputs: inputsOf({ lengthM, faultedArm: faulted, soundArm: sound }),
  };
}

export type CapacitanceInput = {
  lengthM: number;
  /** Broken conductor against the others, measured from the near end. */
  faultedNf: number;
  /** A sound conductor of the same cable against the others, whole length. */
  soundNf: number;
  /** Broken conductor measured from the far end, when reachable. */
  farFaultedNf?: number | undefined;
  capacitanceAccuracyFraction?: number | undefined;
};

/** Above this the two ends' readings cannot describe a single break on this cable. */
const CAPACITANCE_MISMATCH_REFUSED = 0.5;

/**
 * An open conductor's capacitance is proportional to the length still attached:
 * x = L · C_x / C_sound from one end, x = L · C1 / (C1 + C2) from both ends.
 */
export function locateByCapacitance(input: CapacitanceInput, units: LengthSystem = 'metric'): FaultEstimate {
  const f = lengthWords(units);
  const lengthM = requirePositive('lengthM', input.lengthM, 'a length in m');
  const c1 = requirePositive('faultedNf', input.faultedNf, 'a capacitance in nF');
  const cs = requirePositive('soundNf', input.soundNf, 'a capacitance in nF');
  const c2 = input.farFaultedNf === undefined ? undefined : requirePositive('farFaultedNf', input.farFaultedNf, 'a capacitance in nF');
  const eps = requireNonNegative(
    'capacitanceAccuracyFraction',
    input.capacitanceAccuracyFraction ?? DEFAULT_CAPACITANCE_ACCURACY_FRACTION,
    'a fraction',
  );

  if (c2 === undefined) {
    const distanceM = (lengthM * c1) / cs;
    const uncertaintyM = distanceM * Math.SQRT2 * eps;
    const edgeNote = checkInsideCable(
      distanceM,
      uncertaintyM,
      lengthM,
      'faultedNf',
      'The broken conductor shows more capacitance than a sound one over the whole length: check that both were measured the same way (against the same other conductors) and that the sound conductor really is sound.',
      f,
    );
    return {
      method: 'capacitance',
      distanceM,
      fromOtherEndM: lengthM - distanceM,
      uncertaintyM,
      explanation:
        `The broken conductor shows ${num(c1)} nF from this end against ${num(cs)} nF for a sound conductor over the whole ${f.m(lengthM)}, ` +
        `so the break is ${f.where(distanceM, uncertaintyM, lengthM)} (capacitance readings taken to ±${num(eps * 100, 2)} %).${edgeNote}`,
      inputs: inputsOf({ lengthM, faultedNf: c1, soundNf: cs }),
    };
  }

  const total = c1 + c2;
  const distanceM = (lengthM * c1) / total;
  const mismatch = (total - cs) / cs;
  if (Math.abs(mismatch) > CAPACITANCE_MISMATCH_REFUSED) {
    throw new FaultLocationError(
      'farFaultedNf',
      `The two ends' readings add up to ${num(total)} nF but a sound conductor reads ${num(cs)} nF (${num(mismatch * 100, 2)} % off). These readings do not describe one break on this cable; re-measure both ends the same way.`,
    );
  }
  // Each one-end estimate (C1/Cs from the near end, C2/Cs from the far end) differs from the
  // other by L · |mismatch|; half that spread joins the band.
  const spreadM = (lengthM * Math.abs(mismatch)) / 2;
  const measureM = (lengthM / total ** 2) * Math.hypot(c2 * c1 * eps, c1 * c2 * eps);
  const uncertaintyM = Math.hypot(measureM, spreadM);
  checkInsideCable(distanceM, uncertaintyM, lengthM, 'faultedNf', '', f);
  const consistency =
    Math.abs(mismatch) <= 2 * eps
      ? `The two readings add up to ${num(total)} nF, consistent with the sound conductor's ${num(cs)} nF.`
      : `The two readings add up to ${num(total)} nF, ${num(Math.abs(mismatch) * 100, 2)} % ${mismatch > 0 ? 'more' : 'less'} than the sound conductor's ${num(cs)} nF, which widens the band; the break may be partial or the readings taken differently.`;
  return {
    method: 'capacitance',
    distanceM,
    fromOtherEndM: lengthM - distanceM,
    uncertaintyM,
    explanation:
      `The broken conductor shows ${num(c1)} nF from the near end and ${num(c2)} nF from the far end, so the break is ` +
      `${f.where(distanceM, uncertaintyM, lengthM)}. ${consistency}`,
    inputs: inputsOf({ lengthM, faultedNf: c1, soundNf: cs, farFaultedNf: c2 }),
  };
}

/** A position found by flexing the cable by hand, recorded as a located fault. */
export function recordFlexTest(
  input: { distanceM: number; lengthM?: number | undefined; uncertaintyM?: number | undefined },
  units: LengthSystem = 'metric',
  options?: LocateOptions,
): FaultEstimate {
  const f = lengthWords(units);
  const distanceM = requireNonNegative('distanceM', input.distanceM, 'a distance in m');
  const lengthM = input.lengthM === undefined ? undefined : requirePositive('lengthM', input.lengthM, 'a length in m');
  const uncertaintyM =
    input.uncertaintyM === undefined
      ? DEFAULT_FLEX_TEST_UNCERTAINTY_M
      : requirePositive('uncertaintyM', input.uncertaintyM, 'an uncertainty in m');
  if (lengthM !== undefined && distanceM > lengthM) {
    throw new FaultLocationError(
      'distanceM',
      `${f.m(distanceM)} is beyond the end of this ${f.m(lengthM)} cable; measure from the named end again.`,
    );
  }
  checkPlausible(distanceM, lengthM, 'distanceM', options, f);
  return withLength(
    {
      method: 'flex',
      distanceM,
      uncertaintyM,
      explanation: `Found by flexing the cable by hand: the fault is ${f.where(distanceM, uncertaintyM, lengthM)}.`,
      inputs: inputsOf({ distanceM, lengthM, uncertaintyM }),
    },
    lengthM,
  );
}

// ---------------------------------------------------------------------------------------------
// Combining

export type CombinedEstimate = {
  distanceM: number;
  uncertaintyM: number;
  agree: boolean;
  /** Index pairs (into the input array) whose bands do not overlap. */
  disagreements: Array<[number, number]>;
  explanation: string;
};

/**
 * Inverse-variance weighted mean. When the bands do not all overlap, the band is widened by the
 * Birge ratio √(χ² / (n − 1)) so that it reflects the scatter, not only the claimed bands.
 * All estimates must be measured from the same end.
 */
export function combineEstimates(estimates: FaultEstimate[], units: LengthSystem = 'metric'): CombinedEstimate {
  const { m, pm, ohmPerWords } = lengthWords(units);
  if (estimates.length === 0) throw new FaultLocationError('estimates', 'There is no estimate to combine.');
  estimates.forEach((e, i) => {
    if (!Number.isFinite(e.distanceM)) throw new FaultLocationError(`estimates.${i}.distanceM`, 'Each estimate needs a distance.');
    if (!Number.isFinite(e.uncertaintyM) || e.uncertaintyM <= 0) {
      throw new FaultLocationError(`estimates.${i}.uncertaintyM`, 'Each estimate needs an uncertainty greater than 0 to be weighed.');
    }
  });
  const weights = estimates.map((e) => 1 / e.uncertaintyM ** 2);
  const weightSum = weights.reduce((a, b) => a + b, 0);
  const distanceM = estimates.reduce((sum, e, i) => sum + weights[i]! * e.distanceM, 0) / weightSum;
  const statisticalM = 1 / Math.sqrt(weightSum);

  const disagreements: Array<[number, number]> = [];
  for (let i = 0; i < estimates.length; i++) {
    for (let j = i + 1; j < estimates.length; j++) {
      const a = estimates[i]!;
      const b = estimates[j]!;
      if (Math.abs(a.distanceM - b.distanceM) > a.uncertaintyM + b.uncertaintyM) disagreements.push([i, j]);
    }
  }
  const agree = disagreements.length === 0;
  let uncertaintyM = statisticalM;
  if (!agree) {
    const chi2 = estimates.reduce((sum, e, i) => sum + weights[i]! * (e.distanceM - distanceM) ** 2, 0);
    uncertaintyM = statisticalM * Math.max(1, Math.sqrt(chi2 / (estimates.length - 1)));
  }

  const describe = (e: FaultEstimate) => `${e.method} ${m(e.distanceM)} ${pm(e.uncertaintyM)}`;
  let explanation: string;
  if (estimates.length === 1) {
    explanation = `One estimate: the fault is about ${m(distanceM)} ${pm(uncertaintyM)} from the named end.`;
  } else if (agree) {
    explanation = `The ${estimates.length} estimates agree (${estimates.map(describe).join('; ')}). Together: about ${m(distanceM)} ${pm(uncertaintyM)} from the named end.`;
  } else {
    const pairs = disagreements.map(([i, j]) => `${describe(estimates[i]!)} and ${describe(estimates[j]!)}`).join('; ');
    explanation =
      `The estimates disagree: ${pairs} do not overlap. The weighted middle is about ${m(distanceM)}, with the band widened to ${pm(uncertaintyM)} for the scatter. ` +
      `Re-check the readings (same end, same pair, velocity factor, ${ohmPerWords}), or flex-test the cable between the estimates.`;
  }
  return { distanceM, uncertaintyM, agree, disagreements, explanation };
}

// ---------------------------------------------------------------------------------------------
// Per-metre resistance from tables

export const CONDUCTOR_CONSTRUCTIONS = ['class-5-6-plain', 'class-5-6-tinned', 'class-1-2-plain'] as const;
export type ConductorConstruction = (typeof CONDUCTOR_CONSTRUCTIONS)[number];

/** IEC 60228, maximum DC resistance at 20 °C, Ω/km. Class 5/6 are the flexible conductors. */
export const IEC_60228_OHM_PER_KM: ReadonlyArray<{ mm2: number } & Record<ConductorConstruction, number>> = [
  { mm2: 0.5, 'class-5-6-plain': 39.0, 'class-5-6-tinned': 40.1, 'class-1-2-plain': 36.0 },
  { mm2: 0.75, 'class-5-6-plain': 26.0, 'class-5-6-tinned': 26.7, 'class-1-2-plain': 24.5 },
  { mm2: 1.0, 'class-5-6-plain': 19.5, 'class-5-6-tinned': 20.0, 'class-1-2-plain': 18.1 },
  { mm2: 1.5, 'class-5-6-plain': 13.3, 'class-5-6-tinned': 13.7, 'class-1-2-plain': 12.1 },
  { mm2: 2.5, 'class-5-6-plain': 7.98, 'class-5-6-tinned': 8.21, 'class-1-2-plain': 7.41 },
];

/** Solid copper at 20 °C, Ω per 1000 ft (HyperPhysics, after Floyd). */
export const AWG_OHM_PER_1000FT: Readonly<Record<18 | 20 | 22 | 24 | 26 | 28, number>> = {
  18: 6.385,
  20: 10.15,
  22: 16.14,
  24: 25.67,
  26: 40.81,
  28: 64.9,
};

/** 100 % IACS: 58.0 MS/m at 20 °C. */
export const COPPER_RESISTIVITY_OHM_M = 1 / 58.0e6;

export function ohmPerMetreFromReading(conductorOhm: number, lengthM: number): number {
  requireNonNegative('conductorOhm', conductorOhm, 'a conductor resistance in Ω');
  requirePositive('lengthM', lengthM, 'a length in m');
  return conductorOhm / lengthM;
}

/** Ω/m of one conductor from its size; flexible plain copper (class 5/6) unless said otherwise. */
export function ohmPerMetreFromConductorSize(input: {
  mm2?: number | undefined;
  awg?: number | undefined;
  construction?: ConductorConstruction | undefined;
}): number {
  if (input.mm2 !== undefined && input.awg !== undefined) {
    throw new FaultLocationError('mm2', 'Give the conductor size in mm² or in AWG, not both.');
  }
  if (input.mm2 !== undefined) {
    const row = IEC_60228_OHM_PER_KM.find((r) => Math.abs(r.mm2 - input.mm2!) < 1e-9);
    if (!row) {
      throw new FaultLocationError(
        'mm2',
        `No IEC 60228 value here for ${input.mm2} mm²; sizes known: ${IEC_60228_OHM_PER_KM.map((r) => r.mm2).join(', ')} mm².`,
      );
    }
    return row[input.construction ?? 'class-5-6-plain'] / 1000;
  }
  if (input.awg !== undefined) {
    const ohmPer1000Ft = AWG_OHM_PER_1000FT[input.awg as keyof typeof AWG_OHM_PER_1000FT];
    if (ohmPer1000Ft === undefined) {
      throw new FaultLocationError(
        'awg',
        `No value here for AWG ${input.awg}; gauges known: ${Object.keys(AWG_OHM_PER_1000FT).join(', ')}.`,
      );
    }
    return ohmPer1000Ft / (1000 * 0.3048);
  }
  throw new FaultLocationError('mm2', 'Give the conductor size in mm² or in AWG.');
}

// ---------------------------------------------------------------------------------------------
// HTTP request → estimate

/** The engine behind POST /api/fault-location; `units` words the explanation for the reader. */
export function runFaultLocation(
  request: FaultLocationRequest,
  units: LengthSystem = 'metric',
  options?: LocateOptions,
): FaultLocationAnswer {
  switch (request.method) {
    case 'tdr':
      return answer(locateByTdr(request, units, options));
    case 'vf-calibration': {
      const calibration = calibrateVelocityFactor(request, units);
      // The far end of the known-good cable is where the reflection comes from.
      return {
        method: 'vf-calibration',
        distanceM: request.lengthM,
        fromOtherEndM: 0,
        uncertaintyM: request.lengthM * (calibration.velocityFactorUncertainty / calibration.velocityFactor),
        velocityFactor: calibration.velocityFactor,
        explanation: calibration.explanation,
      };
    }
    case 'loop-one-end':
      return answer(locateByLoopOneEnd(request, units, options));
    case 'loop-both-ends':
      return answer(locateByLoopBothEnds(request, units));
    case 'murray':
      return answer(locateByMurrayLoop(request, units));
    case 'capacitance':
      return answer(locateByCapacitance(request, units));
    case 'flex':
      return answer(recordFlexTest(request, units, options));
  }
}

function answer(estimate: FaultEstimate): FaultLocationAnswer {
  const out: FaultLocationAnswer = {
    method: estimate.method,
    distanceM: estimate.distanceM,
    uncertaintyM: estimate.uncertaintyM,
    explanation: estimate.explanation,
  };
  if (estimate.fromOtherEndM !== undefined) out.fromOtherEndM = estimate.fromOtherEndM;
  if (estimate.faultOhm !== undefined) out.faultOhm = estimate.faultOhm;
  if (estimate.velocityFactor !== undefined) out.velocityFactor = estimate.velocityFactor;
  return out;
}
