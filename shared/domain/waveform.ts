// Oscilloscope trace analysis for TDR: parse a two-column CSV (time, volts), find the incident
// edge and the first reflection, and measure the round trip between their 50 % points.

import { FaultLocationError, locateByTdr, type FaultEstimate } from './fault-location';
import { indexAtOrBefore } from './decimate';
import type { LengthSystem } from './units';

export class WaveformError extends Error {
  readonly code = 'waveform-refused';
  constructor(message: string) {
    super(message);
    this.name = 'WaveformError';
  }
}

export type Trace = { timeS: Float64Array; volts: Float64Array };
export type ParsedTrace = Trace & { skippedLines: number };

export const DEFAULT_MAX_SAMPLES = 2_000_000;
/** Fewer samples cannot hold a baseline, an edge, a plateau and a reflection. */
export const MIN_SAMPLES = 16;
/** Scopes export a few channels; more columns than this is not a trace. */
export const MAX_COLUMNS = 8;
/** Non-numeric lines tolerated inside the data (a repeated header, a footer line). */
export const GARBAGE_LINE_ALLOWANCE = 10;

// ---------------------------------------------------------------------------------------------
// CSV

type Delimiter = ',' | ';' | '\t' | 'whitespace';

/**
 * Two numeric columns: time (s) and volts; extra columns (up to 8) are ignored. Lines before the
 * data that are not two numbers (header, instrument metadata) are skipped. The delimiter is
 * detected on the first data line: semicolon or tab files may use decimal commas.
 * A hand loop with indexOf rather than split/regex, so a million lines parse in well under a second.
 */
export function parseTraceCsv(text: string, opts?: { maxSamples?: number }): ParsedTrace {
  if (typeof text !== 'string') throw new WaveformError('The trace must be a text (CSV) file.');
  const maxSamples = opts?.maxSamples ?? DEFAULT_MAX_SAMPLES;
  if (!Number.isInteger(maxSamples) || maxSamples < MIN_SAMPLES) {
    throw new WaveformError(`maxSamples must be a whole number of at least ${MIN_SAMPLES}.`);
  }

  let lineCount = 1;
  for (let i = text.indexOf('\n'); i !== -1; i = text.indexOf('\n', i + 1)) lineCount++;
  const capacity = Math.min(lineCount, maxSamples);
  const timeS = new Float64Array(capacity);
  const volts = new Float64Array(capacity);

  let n = 0;
  let skippedLines = 0;
  let garbage = 0;
  let lineNo = 0;
  let delimiter: Delimiter | null = null;
  let decimalComma = false;
  const row = { time: 0, volts: 0, columns: 0 };
  let pos = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const length = text.length;

  while (pos < length) {
    let end = text.indexOf('\n', pos);
    if (end === -1) end = length;
    let lineEnd = end;
    if (lineEnd > pos && text.charCodeAt(lineEnd - 1) === 13) lineEnd--;
    const start = pos;
    pos = end + 1;
    lineNo++;

    if (delimiter === null) {
      const detected = detectDelimiter(text, start, lineEnd);
      if (!parseRow(text, start, lineEnd, detected.delimiter, detected.decimalComma, row)) {
        skippedLines++;
        continue;
      }
      delimiter = detected.delimiter;
      decimalComma = detected.decimalComma;
    } else if (!parseRow(text, start, lineEnd, delimiter, decimalComma, row)) {
      skippedLines++;
      if (isBlank(text, start, lineEnd)) continue;
      garbage++;
      if (garbage > GARBAGE_LINE_ALLOWANCE) {
        throw new WaveformError(
          `Line ${lineNo} is not two numbers (time, volts): “${text.slice(start, Math.min(lineEnd, start + 60))}”. More than ${GARBAGE_LINE_ALLOWANCE} such lines inside the data; export the trace again as CSV.`,
        );
      }
      continue;
    }

    if (row.columns > MAX_COLUMNS) {
      throw new WaveformError(
        `Line ${lineNo} has ${row.columns} columns; a trace has two (time, volts), at most ${MAX_COLUMNS} columns are accepted.`,
      );
    }
    if (n >= maxSamples) {
      throw new WaveformError(
        `The trace has more than ${maxSamples.toLocaleString('en')} samples; export a shorter window or fewer points.`,
      );
    }
    if (n > 0 && !(row.time > timeS[n - 1]!)) {
      throw new WaveformError(
        `Time does not increase at line ${lineNo} (${row.time} s after ${timeS[n - 1]} s); the first column must be time in seconds, in order.`,
      );
    }
    timeS[n] = row.time;
    volts[n] = row.volts;
    n++;
  }

  if (n === 0) {
    throw new WaveformError('No numeric rows found: the file needs two columns, time (s) and volts, e.g. “1.2e-9,0.25”.');
  }
  if (n < MIN_SAMPLES) {
    throw new WaveformError(`Only ${n} samples; a trace needs at least ${MIN_SAMPLES} to show a baseline, an edge and a reflection.`);
  }
  return {
    timeS: n === capacity ? timeS : timeS.slice(0, n),
    volts: n === capacity ? volts : volts.slice(0, n),
    skippedLines,
  };
}

function detectDelimiter(text: string, start: number, end: number): { delimiter: Delimiter; decimalComma: boolean } {
  // Bounded to the line: an unbounded indexOf would scan the rest of the file for every header line.
  const has = (c: string) => indexWithin(text, c, start, end) !== -1;
  if (has(';')) return { delimiter: ';', decimalComma: true };
  if (has('\t')) return { delimiter: '\t', decimalComma: true };
  if (has(',')) return { delimiter: ',', decimalComma: false };
  return { delimiter: 'whitespace', decimalComma: false };
}

/** indexOf that stops at `end`, so a line without the character costs its own length, not the file's. */
function indexWithin(text: string, c: string, from: number, end: number): number {
  const code = c.charCodeAt(0);
  for (let i = from; i < end; i++) if (text.charCodeAt(i) === code) return i;
  return -1;
}

function isBlank(text: string, start: number, end: number): boolean {
  for (let i = start; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c !== 32 && c !== 9) return false;
  }
  return true;
}

function parseRow(
  text: string,
  start: number,
  end: number,
  delimiter: Delimiter,
  decimalComma: boolean,
  out: { time: number; volts: number; columns: number },
): boolean {
  if (delimiter === 'whitespace') {
    const fields = text.slice(start, end).trim().split(/\s+/);
    if (fields.length < 2) return false;
    const t = toNumber(fields[0]!, false);
    const v = toNumber(fields[1]!, false);
    if (Number.isNaN(t) || Number.isNaN(v)) return false;
    out.time = t;
    out.volts = v;
    out.columns = fields.length;
    return true;
  }
  // Fast path, the common line "number,number": each character is read once, the delimiter found
  // where the first number stops. Anything else takes the general path below.
  const t0 = scanNumber(text, start, end, decimalComma);
  if (scanExact && scanStop < end && text.charCodeAt(scanStop) === delimiter.charCodeAt(0)) {
    const v0 = scanNumber(text, scanStop + 1, end, decimalComma);
    if (scanExact && scanStop === end) {
      out.time = t0;
      out.volts = v0;
      out.columns = 2;
      return true;
    }
  }
  const i1 = indexWithin(text, delimiter, start, end);
  if (i1 === -1) return false;
  let i2 = indexWithin(text, delimiter, i1 + 1, end);
  if (i2 === -1) i2 = end;
  const t = fieldNumber(text, start, i1, decimalComma);
  if (Number.isNaN(t)) return false;
  const v = fieldNumber(text, i1 + 1, i2, decimalComma);
  if (Number.isNaN(v)) return false;
  let columns = 2;
  // Count further columns (a trailing delimiter leaves an empty one, which does not count).
  for (let i = i2; i < end;) {
    const next = indexWithin(text, delimiter, i + 1, end);
    const stop = next === -1 ? end : next;
    if (!isBlank(text, i + 1, stop)) columns++;
    if (columns > MAX_COLUMNS) break;
    i = stop;
  }
  out.time = t;
  out.volts = v;
  out.columns = columns;
  return true;
}

const POW10 = [
  1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/**
 * A number read straight from the characters, without making a string per field. Exact where it
 * answers: a mantissa below 2^53 times or divided by an exact power of ten (10^0…10^22) is one
 * correctly rounded operation (Clinger's fast path). Anything else goes to Number().
 */
function fieldNumber(text: string, start: number, end: number, decimalComma: boolean): number {
  const value = scanNumber(text, start, end, decimalComma);
  return scanExact && scanStop === end ? value : toNumber(text.slice(start, end), decimalComma);
}

// Where scanNumber stopped, and whether its value is exact (else the caller falls back to Number()).
let scanStop = 0;
let scanExact = false;

/**
 * Reads a number from `start`, stopping at the first character that cannot continue it (or at
 * `end`); sets scanStop there and scanExact when the fast path applies (Clinger, see above).
 */
function scanNumber(text: string, start: number, end: number, decimalComma: boolean): number {
  scanExact = false;
  let i = start;
  let negative = false;
  let c = text.charCodeAt(i);
  if (c === 45 || c === 43) {
    negative = c === 45;
    c = text.charCodeAt(++i);
  }
  let mantissa = 0;
  let digits = 0;
  let scale = 0;
  let seenPoint = false;
  for (; i < end; c = text.charCodeAt(++i)) {
    if (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      if (seenPoint) scale--;
    } else if ((c === 46 || (decimalComma && c === 44)) && !seenPoint) seenPoint = true;
    else break;
  }
  scanStop = i;
  if (digits === 0 || digits > 15) return NaN;
  if (i < end && (c === 101 || c === 69)) {
    c = text.charCodeAt(++i);
    let expNegative = false;
    if (c === 45 || c === 43) {
      expNegative = c === 45;
      c = text.charCodeAt(++i);
    }
    let exp = 0;
    let expDigits = 0;
    for (; i < end && c >= 48 && c <= 57; c = text.charCodeAt(++i)) {
      exp = exp * 10 + (c - 48);
      expDigits++;
    }
    scanStop = i;
    if (expDigits === 0 || expDigits > 3) return NaN;
    scale += expNegative ? -exp : exp;
  }
  if (scale < -22 || scale > 22) return NaN;
  scanExact = true;
  const value = scale < 0 ? mantissa / POW10[-scale]! : mantissa * POW10[scale]!;
  return negative ? -value : value;
}

function toNumber(field: string, decimalComma: boolean): number {
  let s = field.trim();
  if (s.length >= 2 && s.charCodeAt(0) === 34 && s.charCodeAt(s.length - 1) === 34) s = s.slice(1, -1).trim();
  if (s.length === 0) return NaN; // Number('') is 0
  if (decimalComma && s.includes(',')) s = s.replace(',', '.');
  const value = Number(s);
  return Number.isFinite(value) ? value : NaN;
}

// ---------------------------------------------------------------------------------------------
// Analysis

export type TracePoint = { timeS: number; volts: number };

export type WaveformMarkers = {
  incident: TracePoint;
  reflection: TracePoint | null;
  /** Pre-edge baseline fitted as a line: volts = interceptV + slopeVPerS · t. */
  baseline: { interceptV: number; slopeVPerS: number };
  /** Absolute volts: the baseline at the incident edge, the incident plateau, the level after the reflection. */
  levels: { baselineV: number; incidentV: number; reflectedV: number | null };
};

export type WaveformAnalysis = {
  markers: WaveformMarkers;
  roundTripNs: number | null;
  /** Open: the reflection steps the same way as the incident (ρ > 0); short: the opposite way. */
  polarity: 'open' | 'short' | null;
  /** Reflected step / incident step: +1 for an open, −1 for a short. */
  reflectionCoefficient: number | null;
  incidentStepV: number;
  reflectedStepV: number | null;
  /** 10–90 % rise time of the incident edge as recorded. */
  riseTimeNs: number;
  sampleIntervalNs: number;
  noiseV: number;
  estimate: FaultEstimate | null;
  distanceM: number | null;
  uncertaintyM: number | null;
  message: string;
};

export type WaveformOptions = {
  velocityFactor?: number | undefined;
  /** When given, a reflection beyond the cable is reported rather than turned into a distance. */
  lengthM?: number | undefined;
  /** The length words of the explanation (metres by default); the numbers stay in metres. */
  units?: LengthSystem | undefined;
};

type Region = { start: number; end: number; peak: number };

export function analyseWaveform(trace: Trace, opts?: WaveformOptions): WaveformAnalysis {
  const { timeS, volts } = checkTrace(trace);
  const n = timeS.length;
  const sampleIntervalS = (timeS[n - 1]! - timeS[0]!) / (n - 1);
  const noiseV = robustNoise(volts);
  // Half-window of the step detector: wide enough to average noise, narrow enough that the
  // incident and a near reflection stay apart.
  const h = Math.max(4, Math.min(32, Math.round(n / 256)));
  const noiseD = noiseV * Math.sqrt(2 / h);

  // Two buffers serve both passes (a million samples is 8 MB a buffer): prefix sums of the
  // filtered trace, and the step detector's output.
  const prefix = new Float64Array(n + 1);
  const stepBuf = new Float64Array(n);
  // Pass 1 on the raw trace, only to find where the baseline ends.
  median5Prefix(volts, prefix);
  const rough = stepFromPrefix(prefix, n, h, stepBuf);
  const roughIncident = findIncident(rough, noiseD);
  if (!roughIncident) {
    throw new WaveformError(
      `No incident edge: nothing in the trace steps clearly above the noise (about ${formatVolts(noiseV)}). Check the probe and the trigger.`,
    );
  }
  const preEdge = roughIncident.region.start;
  // The detector is blind in the first h samples: a step already under way there (or a region
  // reaching back to them) means the record began on the incident edge.
  const roughMax = Math.abs(rough[roughIncident.region.peak]!);
  const startsOnEdge = Math.abs(rough[h - 1]!) > Math.max(6 * noiseD, 0.05 * roughMax);
  if (preEdge <= h - 1 || startsOnEdge) {
    throw new WaveformError('The trace starts on the incident edge; record some time before the pulse so the baseline can be measured.');
  }
  const baseline = fitBaseline(timeS, volts, preEdge);

  // Pass 2 on the trace with the baseline (and its slope) taken off: detrend, median-5 and prefix
  // sums in one loop; the 3-sample mean and the step detector read the prefix sums.
  const filtered = detrendedMedian5(timeS, volts, baseline, prefix);
  const smooth = (i: number) => {
    const s = Math.max(0, i - 1);
    const e = Math.min(n, i + 2);
    return (prefix[e]! - prefix[s]!) / (e - s);
  };
  const d = stepFromPrefix(prefix, n, h, stepBuf);
  const incident = findIncident(d, noiseD);
  if (!incident) throw new WaveformError('No incident edge found after removing the baseline.');
  const peakD = Math.abs(d[incident.region.peak]!);
  const extentThreshold = Math.max(3 * noiseD, 0.05 * peakD);
  const detectThreshold = Math.max(5 * noiseD, 0.1 * peakD);

  const reflectionRegion = findRegionAfter(d, incident.region.end + 1, detectThreshold, extentThreshold);
  const plateauEnd = reflectionRegion ? reflectionRegion.start : n;
  const incidentLevel = medianOf(filtered, incident.region.end + 1, plateauEnd);
  if (!Number.isFinite(incidentLevel)) {
    throw new WaveformError('The incident edge runs into the end of the record; record a longer window after the pulse.');
  }
  const incidentStepV = incidentLevel;
  const incidentCross = edgeMidpoint(timeS, smooth, 0, incidentStepV, incident.region);
  const riseTimeS = riseTime(timeS, smooth, incidentStepV, incident.region);

  const incidentMarker: TracePoint = { timeS: incidentCross, volts: baselineAt(baseline, incidentCross) + incidentStepV / 2 };
  const base = {
    incidentStepV,
    riseTimeNs: riseTimeS * 1e9,
    sampleIntervalNs: sampleIntervalS * 1e9,
    noiseV,
  };
  const noReflection = (message: string): WaveformAnalysis => ({
    ...base,
    markers: {
      incident: incidentMarker,
      reflection: null,
      baseline,
      levels: {
        baselineV: baselineAt(baseline, incidentCross),
        incidentV: baselineAt(baseline, incidentCross) + incidentStepV,
        reflectedV: null,
      },
    },
    roundTripNs: null,
    polarity: null,
    reflectionCoefficient: null,
    reflectedStepV: null,
    estimate: null,
    distanceM: null,
    uncertaintyM: null,
    message,
  });

  if (!reflectionRegion) {
    return noReflection(
      'No reflection found after the incident edge: over the recorded window the cable looks matched. Record a longer window, or check that the far end is connected to the instrument.',
    );
  }
  const plateauLength = Math.max(plateauEnd - (incident.region.end + 1), 4 * h);
  const nextEdge = findRegionAfter(d, reflectionRegion.end + 1, detectThreshold, extentThreshold);
  const afterEnd = Math.min(nextEdge ? nextEdge.start : n, reflectionRegion.end + 1 + plateauLength);
  const reflectedLevel = medianOf(filtered, reflectionRegion.end + 1, afterEnd);
  if (!Number.isFinite(reflectedLevel)) {
    return noReflection('A reflection starts at the very end of the record; record a longer window to measure it.');
  }
  const reflectedStepV = reflectedLevel - incidentLevel;
  const rho = reflectedStepV / incidentStepV;
  const reflectionCross = edgeMidpoint(timeS, smooth, incidentLevel, reflectedLevel, reflectionRegion);
  const roundTripNs = (reflectionCross - incidentCross) * 1e9;
  const polarity: 'open' | 'short' = rho > 0 ? 'open' : 'short';

  let estimate: FaultEstimate | null = null;
  let distanceNote: string;
  if (opts?.velocityFactor !== undefined) {
    try {
      estimate = locateByTdr(
        {
          roundTripNs,
          velocityFactor: opts.velocityFactor,
          riseTimeNs: riseTimeS * 1e9,
          ...(opts.lengthM === undefined ? {} : { lengthM: opts.lengthM }),
        },
        opts.units,
      );
      distanceNote = ` ${estimate.explanation}`;
    } catch (error) {
      if (!(error instanceof FaultLocationError)) throw error;
      distanceNote = ` No distance given: ${error.message}`;
    }
  } else {
    distanceNote = ' Give the cable’s velocity factor to turn this into a distance.';
  }
  const kind =
    Math.abs(rho) >= 0.5
      ? polarity === 'open'
        ? 'an open conductor (or a high-resistance break)'
        : 'a short between the conductors'
      : polarity === 'open'
        ? 'a rise in impedance (a partial break, a stretched or crushed section) rather than a clean open'
        : 'a fall in impedance (a partial short, a wet or squashed section) rather than a dead short';

  return {
    ...base,
    markers: {
      incident: incidentMarker,
      reflection: { timeS: reflectionCross, volts: baselineAt(baseline, reflectionCross) + incidentLevel + reflectedStepV / 2 },
      baseline,
      levels: {
        baselineV: baselineAt(baseline, incidentCross),
        incidentV: baselineAt(baseline, incidentCross) + incidentLevel,
        reflectedV: baselineAt(baseline, reflectionCross) + reflectedLevel,
      },
    },
    roundTripNs,
    polarity,
    reflectionCoefficient: rho,
    reflectedStepV,
    estimate,
    distanceM: estimate ? estimate.distanceM : null,
    uncertaintyM: estimate ? estimate.uncertaintyM : null,
    message:
      `The reflection arrives ${roundTripNs.toFixed(2)} ns after the incident edge and steps ${polarity === 'open' ? 'the same way' : 'the opposite way'} ` +
      `(reflection coefficient ${rho >= 0 ? '+' : ''}${rho.toFixed(2)}): ${kind}.${distanceNote}`,
  };
}

export type MarkerEstimate = {
  roundTripNs: number;
  markers: { incident: TracePoint; reflection: TracePoint };
  polarity: 'open' | 'short' | null;
  reflectionCoefficient: number | null;
  estimate: FaultEstimate | null;
  distanceM: number | null;
  uncertaintyM: number | null;
  message: string;
};

/** For when the technician moves the markers by hand: the round trip between the two times. */
export function estimateFromMarkers(
  trace: Trace,
  incidentTimeS: number,
  reflectionTimeS: number,
  opts?: WaveformOptions & { riseTimeNs?: number | undefined },
): MarkerEstimate {
  const { timeS, volts } = checkTrace(trace);
  const n = timeS.length;
  const first = timeS[0]!;
  const last = timeS[n - 1]!;
  for (const [name, value] of [
    ['incidentTimeS', incidentTimeS],
    ['reflectionTimeS', reflectionTimeS],
  ] as const) {
    if (!Number.isFinite(value) || value < first || value > last) {
      throw new WaveformError(`${name} must lie within the trace (${first} s to ${last} s).`);
    }
  }
  if (!(reflectionTimeS > incidentTimeS)) {
    throw new WaveformError('The reflection marker must come after the incident marker.');
  }
  const roundTripNs = (reflectionTimeS - incidentTimeS) * 1e9;
  const iInc = indexAtOrBefore(timeS, incidentTimeS);
  const iRef = indexAtOrBefore(timeS, reflectionTimeS);
  // Steps measured a few samples either side of each marker, clear of the edge itself.
  const gap = 2;
  const span = Math.max(1, Math.min(16, Math.floor((iRef - iInc) / 2) - gap));
  const incidentStep = meanOf(volts, iInc + 1 + gap, iInc + 1 + gap + span) - meanOf(volts, iInc - gap - span, iInc - gap);
  const reflectedStep = meanOf(volts, iRef + 1 + gap, iRef + 1 + gap + span) - meanOf(volts, iRef - gap - span, iRef - gap);
  const rho = Number.isFinite(incidentStep) && Number.isFinite(reflectedStep) && incidentStep !== 0 ? reflectedStep / incidentStep : null;
  const polarity = rho === null ? null : rho > 0 ? 'open' : 'short';

  let estimate: FaultEstimate | null = null;
  let note = ' Give the cable’s velocity factor to turn this into a distance.';
  if (opts?.velocityFactor !== undefined) {
    try {
      estimate = locateByTdr(
        {
          roundTripNs,
          velocityFactor: opts.velocityFactor,
          ...(opts.riseTimeNs === undefined ? {} : { riseTimeNs: opts.riseTimeNs }),
          ...(opts.lengthM === undefined ? {} : { lengthM: opts.lengthM }),
        },
        opts.units,
      );
      note = ` ${estimate.explanation}`;
    } catch (error) {
      if (!(error instanceof FaultLocationError)) throw error;
      note = ` No distance given: ${error.message}`;
    }
  }
  return {
    roundTripNs,
    markers: {
      incident: { timeS: incidentTimeS, volts: interpolate(timeS, volts, incidentTimeS) },
      reflection: { timeS: reflectionTimeS, volts: interpolate(timeS, volts, reflectionTimeS) },
    },
    polarity,
    reflectionCoefficient: rho,
    estimate,
    distanceM: estimate ? estimate.distanceM : null,
    uncertaintyM: estimate ? estimate.uncertaintyM : null,
    message: `Markers placed by hand: ${roundTripNs.toFixed(2)} ns apart.${note}`,
  };
}

/** Same as estimateFromMarkers: the name the plot's drag handler uses. */
export const moveMarkers = estimateFromMarkers;

// ---------------------------------------------------------------------------------------------
// Signal helpers

function checkTrace(trace: Trace): Trace {
  const { timeS, volts } = trace;
  if (!timeS || !volts || timeS.length !== volts.length) {
    throw new WaveformError('A trace needs as many volts samples as time samples.');
  }
  if (timeS.length < MIN_SAMPLES) throw new WaveformError(`A trace needs at least ${MIN_SAMPLES} samples.`);
  for (let i = 0; i < timeS.length; i++) {
    if (!Number.isFinite(timeS[i]!) || !Number.isFinite(volts[i]!)) throw new WaveformError(`Sample ${i + 1} is not a number.`);
    if (i > 0 && !(timeS[i]! > timeS[i - 1]!)) throw new WaveformError(`Time does not increase at sample ${i + 1}.`);
  }
  return trace;
}

/** σ from the median absolute deviation of first differences; the few edges do not move it. */
function robustNoise(volts: Float64Array): number {
  const n = volts.length;
  const stride = Math.max(1, Math.floor((n - 1) / 200_000));
  const diffs = new Float64Array(Math.floor((n - 2) / stride) + 1);
  let k = 0;
  for (let i = 1; i < n && k < diffs.length; i += stride) diffs[k++] = volts[i]! - volts[i - 1]!;
  const used = diffs.subarray(0, k);
  const mid = medianInPlace(Float64Array.from(used));
  for (let i = 0; i < k; i++) used[i] = Math.abs(used[i]! - mid);
  return (1.4826 * medianInPlace(used)) / Math.SQRT2;
}

function medianOf(values: Float64Array, start: number, end: number): number {
  const s = Math.max(0, start);
  const e = Math.min(values.length, end);
  if (e - s < 1) return NaN;
  return medianInPlace(values.slice(s, e));
}

/** Median by quickselect (Hoare), O(n) on average: a full sort of a million samples is too slow. */
function medianInPlace(a: Float64Array): number {
  const n = a.length;
  if (n === 0) return NaN;
  const hi = selectKth(a, n >> 1);
  if (n % 2) return hi;
  // After selection everything left of n/2 is ≤ a[n/2]: the lower middle is their maximum.
  let lo = -Infinity;
  for (let i = 0; i < n >> 1; i++) if (a[i]! > lo) lo = a[i]!;
  return (lo + hi) / 2;
}

function selectKth(a: Float64Array, k: number): number {
  let left = 0;
  let right = a.length - 1;
  while (right > left) {
    const pivot = a[(left + right) >> 1]!;
    let i = left;
    let j = right;
    while (i <= j) {
      while (a[i]! < pivot) i++;
      while (a[j]! > pivot) j--;
      if (i <= j) {
        const tmp = a[i]!;
        a[i] = a[j]!;
        a[j] = tmp;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return a[k]!;
  }
  return a[k]!;
}

function meanOf(values: Float64Array, start: number, end: number): number {
  const s = Math.max(0, start);
  const e = Math.min(values.length, end);
  if (e - s < 1) return NaN;
  let sum = 0;
  for (let i = s; i < e; i++) sum += values[i]!;
  return sum / (e - s);
}

// Median of 5 removes spikes and keeps edges where they are (a monotone edge is unchanged); the
// two samples at either end are kept as they are.

/** prefix[i + 1] = Σ median5(x)[0…i], without keeping the filtered trace. */
function median5Prefix(x: Float64Array, prefix: Float64Array): void {
  const n = x.length;
  prefix[0] = 0;
  prefix[1] = x[0]!;
  prefix[2] = prefix[1]! + x[1]!;
  for (let i = 2; i < n - 2; i++) prefix[i + 1] = prefix[i]! + median5Of(x[i - 2]!, x[i - 1]!, x[i]!, x[i + 1]!, x[i + 2]!);
  prefix[n - 1] = prefix[n - 2]! + x[n - 2]!;
  prefix[n] = prefix[n - 1]! + x[n - 1]!;
}

/**
 * median5(volts − baseline) in one pass over the trace (a sliding window of five detrended values),
 * with its prefix sums written to `prefix`.
 */
function detrendedMedian5(
  timeS: Float64Array,
  volts: Float64Array,
  baseline: { interceptV: number; slopeVPerS: number },
  prefix: Float64Array,
): Float64Array {
  const n = volts.length;
  const { interceptV, slopeVPerS } = baseline;
  const out = new Float64Array(n);
  const at = (i: number) => volts[i]! - (interceptV + slopeVPerS * timeS[i]!);
  let w0 = at(0);
  let w1 = at(1);
  let w2 = at(2);
  let w3 = at(3);
  let w4 = at(4);
  out[0] = w0;
  out[1] = w1;
  prefix[0] = 0;
  prefix[1] = w0;
  prefix[2] = w0 + w1;
  for (let i = 2; i < n - 2; i++) {
    const m = median5Of(w0, w1, w2, w3, w4);
    out[i] = m;
    prefix[i + 1] = prefix[i]! + m;
    w0 = w1;
    w1 = w2;
    w2 = w3;
    w3 = w4;
    if (i + 3 < n) w4 = at(i + 3);
  }
  out[n - 2] = w2;
  out[n - 1] = w3;
  prefix[n - 1] = prefix[n - 2]! + w2;
  prefix[n] = prefix[n - 1]! + w3;
  return out;
}

/** Median of five without sorting: the median of e and the two "inner" values of the pairs (a,b), (c,d). */
function median5Of(a: number, b: number, c: number, d: number, e: number): number {
  const f = Math.max(Math.min(a, b), Math.min(c, d));
  const g = Math.min(Math.max(a, b), Math.max(c, d));
  return Math.max(Math.min(e, f), Math.min(Math.max(e, f), g));
}

/**
 * D[i] = mean(x[i+1 … i+h]) − mean(x[i−h+1 … i]): the step between samples i and i+1, from the
 * prefix sums of x, written into `d` (0 where the window does not fit).
 */
function stepFromPrefix(prefix: Float64Array, n: number, h: number, d: Float64Array): Float64Array {
  for (let i = 0; i < h - 1; i++) d[i] = 0;
  for (let i = h - 1; i + h < n; i++) {
    d[i] = (prefix[i + h + 1]! - prefix[i + 1]! - (prefix[i + 1]! - prefix[i + 1 - h]!)) / h;
  }
  for (let i = Math.max(h - 1, n - h); i < n; i++) d[i] = 0;
  return d;
}

/**
 * The incident edge is the first step at least half as large as the largest one: a passive
 * fault cannot reflect more than the incident step, so the first big step is the incident.
 */
function findIncident(d: Float64Array, noiseD: number): { region: Region } | null {
  let maxAbs = 0;
  for (let i = 0; i < d.length; i++) if (Math.abs(d[i]!) > maxAbs) maxAbs = Math.abs(d[i]!);
  if (maxAbs === 0 || maxAbs < 6 * noiseD) return null;
  const extent = Math.max(3 * noiseD, 0.05 * maxAbs);
  const region = findRegionAfter(d, 0, 0.5 * maxAbs, extent);
  return region ? { region } : null;
}

/** First run where |D| passes `detect`, widened to where it stays above `extent` with the same sign. */
function findRegionAfter(d: Float64Array, from: number, detect: number, extent: number): Region | null {
  const n = d.length;
  let i = from;
  while (i < n && Math.abs(d[i]!) <= detect) i++;
  if (i >= n) return null;
  const sign = Math.sign(d[i]!);
  let start = i;
  while (start > from && Math.sign(d[start - 1]!) === sign && Math.abs(d[start - 1]!) > extent) start--;
  let end = i;
  while (end + 1 < n && Math.sign(d[end + 1]!) === sign && Math.abs(d[end + 1]!) > extent) end++;
  let peak = start;
  for (let j = start; j <= end; j++) if (Math.abs(d[j]!) > Math.abs(d[peak]!)) peak = j;
  return { start, end, peak };
}

/**
 * Time of the 50 % point between two levels: a straight line fitted through the edge's samples
 * between 20 % and 80 % of the step (noise averages out over several samples), solved for the
 * midpoint; plain interpolation between two samples when the edge is too steep for a fit.
 */
function edgeMidpoint(timeS: Float64Array, y: (i: number) => number, lowV: number, highV: number, region: Region): number {
  const mid = (lowV + highV) / 2;
  const crossing = crossingNear(timeS, y, mid, region);
  const stepV = highV - lowV;
  const inBand = (i: number) => {
    const f = (y(i) - lowV) / stepV;
    return f >= 0.2 && f <= 0.8;
  };
  const at = Math.min(timeS.length - 2, Math.max(0, indexAtOrBefore(timeS, crossing)));
  let first = at + 1;
  while (first - 1 >= Math.max(0, region.start - 1) && inBand(first - 1)) first--;
  let last = at;
  while (last + 1 <= Math.min(timeS.length - 1, region.end + 1) && inBand(last + 1)) last++;
  if (last - first + 1 < 3) return crossing;
  const t0 = timeS[at]!;
  let st = 0;
  let sy = 0;
  for (let i = first; i <= last; i++) {
    st += timeS[i]! - t0;
    sy += y(i);
  }
  const count = last - first + 1;
  const tMean = st / count;
  const yMean = sy / count;
  let stt = 0;
  let sty = 0;
  for (let i = first; i <= last; i++) {
    const dt = timeS[i]! - t0 - tMean;
    stt += dt * dt;
    sty += dt * (y(i) - yMean);
  }
  if (stt === 0 || sty === 0 || Math.sign(sty) !== Math.sign(stepV)) return crossing;
  const fitted = t0 + tMean + (mid - yMean) / (sty / stt);
  // A fit that lands away from the samples it used is not trusted.
  return fitted >= timeS[first]! && fitted <= timeS[last]! ? fitted : crossing;
}

/** Time where `y` crosses `level` inside the region, interpolated linearly; the crossing nearest the peak wins. */
function crossingNear(timeS: Float64Array, y: (i: number) => number, level: number, region: Region): number {
  const lo = Math.max(0, region.start - 1);
  const hi = Math.min(timeS.length - 2, region.end + 1);
  let best = -1;
  for (let i = lo; i <= hi; i++) {
    const a = y(i) - level;
    const b = y(i + 1) - level;
    if ((a <= 0 && b > 0) || (a >= 0 && b < 0)) {
      if (best === -1 || Math.abs(i - region.peak) < Math.abs(best - region.peak)) best = i;
    }
  }
  if (best === -1) return timeS[region.peak]! + (timeS[region.peak + 1]! - timeS[region.peak]!) / 2;
  const a = y(best) - level;
  const b = y(best + 1) - level;
  const fraction = a === b ? 0.5 : a / (a - b);
  return timeS[best]! + fraction * (timeS[best + 1]! - timeS[best]!);
}

function riseTime(timeS: Float64Array, y: (i: number) => number, stepV: number, region: Region): number {
  const t10 = crossingNear(timeS, y, 0.1 * stepV, region);
  const t90 = crossingNear(timeS, y, 0.9 * stepV, region);
  return Math.max(0, t90 - t10);
}

/** Least-squares line through the pre-edge samples; a constant when there are too few for a slope. */
function fitBaseline(timeS: Float64Array, volts: Float64Array, count: number): { interceptV: number; slopeVPerS: number } {
  if (count < 16) return { interceptV: meanOf(volts, 0, count), slopeVPerS: 0 };
  // Centred on the mean time so the sums stay well conditioned at nanosecond scales.
  const t0 = meanOf(timeS, 0, count);
  const v0 = meanOf(volts, 0, count);
  let stt = 0;
  let stv = 0;
  for (let i = 0; i < count; i++) {
    const dt = timeS[i]! - t0;
    stt += dt * dt;
    stv += dt * (volts[i]! - v0);
  }
  const slope = stt === 0 ? 0 : stv / stt;
  return { interceptV: v0 - slope * t0, slopeVPerS: slope };
}

function baselineAt(baseline: { interceptV: number; slopeVPerS: number }, timeS: number): number {
  return baseline.interceptV + baseline.slopeVPerS * timeS;
}

function interpolate(timeS: Float64Array, volts: Float64Array, t: number): number {
  const i = indexAtOrBefore(timeS, t);
  if (i >= timeS.length - 1) return volts[timeS.length - 1]!;
  const f = (t - timeS[i]!) / (timeS[i + 1]! - timeS[i]!);
  return volts[i]! + f * (volts[i + 1]! - volts[i]!);
}

function formatVolts(v: number): string {
  return Math.abs(v) < 1 ? `${(v * 1000).toPrecision(3)} mV` : `${v.toPrecision(3)} V`;
}
