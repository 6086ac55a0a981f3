// The CPU-heavy work of a request, as plain functions of their inputs: trace analysis, spreadsheet
// reading, certificate and label sheet rendering. They run on the worker threads (task-worker.ts) so a large
// trace or a 120-strip certificate never holds up the readings; each throws an AppError for what a
// person must be told, which the pool carries back to the request.
import { readFileSync } from 'node:fs';
import { FaultLocationError, type FaultLocationAnswer } from '../../shared/domain/fault-location';
import { decimateMinMax, PLOT_MAX_POINTS } from '../../shared/domain/decimate';
import { analyseWaveform, parseTraceCsv, WaveformError, type WaveformAnalysis } from '../../shared/domain/waveform';
import type { LengthSystem } from '../../shared/domain/units';
import type { WaveformQuery } from '../../shared/schemas/waveforms';
import type { WaveformAnswer } from '../../shared/contracts/fault-location';
import type { TraceAnalysisDto } from '../../shared/schemas/attachments';
import { AppError, unprocessable } from '../lib/app-error';
import { readParcel, type BytesParcel } from './parcel';
import type { Sheet, SheetLimits } from '../lib/spreadsheet';
import type { CertificateDocument } from '../pdf/certificate-pdf';
import type { LabelSheetDocument } from '../pdf/label-sheet';

function asUnprocessable(err: unknown): unknown {
  if (err instanceof FaultLocationError) {
    return unprocessable(err.code, err.message, { errors: [{ path: err.field, message: err.message }] });
  }
  if (err instanceof WaveformError) {
    return unprocessable(err.code, err.message, { errors: [{ path: '(body)', message: err.message }] });
  }
  return err;
}

function withoutInputs(estimate: NonNullable<WaveformAnalysis['estimate']>): FaultLocationAnswer {
  const { inputs: _inputs, ...answer } = estimate;
  return answer;
}

/** Text of an uploaded trace in the charset its request named (UTF-8 when none); 415 for one we cannot read. */
function decodeTrace(bytes: Uint8Array, charset: string | undefined): string {
  let decoder: TextDecoder;
  try {
    decoder = new TextDecoder(charset ?? 'utf-8');
  } catch {
    throw new AppError(
      415,
      'unsupported-encoding',
      `The charset "${String(charset).slice(0, 40)}" is not supported; send the trace as UTF-8.`,
    );
  }
  return decoder.decode(bytes);
}

/** POST /api/waveforms/analyse: the engine's analysis of a CSV trace, worded in the asker's units. */
export function waveformAnswer(csv: string, query: WaveformQuery, units: LengthSystem): WaveformAnswer {
  let analysis: WaveformAnalysis;
  let parsed: ReturnType<typeof parseTraceCsv>;
  try {
    parsed = parseTraceCsv(csv);
    analysis = analyseWaveform(parsed, { velocityFactor: query.velocityFactor, lengthM: query.lengthM, units });
  } catch (err) {
    throw asUnprocessable(err);
  }
  const { estimate, ...rest } = analysis;
  const keep = [analysis.markers.incident.timeS];
  if (analysis.markers.reflection) keep.push(analysis.markers.reflection.timeS);
  return {
    ...rest,
    estimate: estimate ? withoutInputs(estimate) : null,
    sampleCount: parsed.timeS.length,
    skippedLines: parsed.skippedLines,
    plot: decimateMinMax(parsed.timeS, parsed.volts, PLOT_MAX_POINTS, keep),
  };
}

/** An uploaded CSV must be UTF-8 text (else 415) and parse as a trace (else 422). */
export function checkTrace(bytes: Uint8Array): { sampleCount: number } {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new AppError(415, 'content-mismatch', 'The trace is not UTF-8 text; export it again as CSV.');
  }
  try {
    return { sampleCount: parseTraceCsv(text).timeS.length };
  } catch (err) {
    if (err instanceof WaveformError) throw unprocessable('trace-unreadable', `This CSV is not a trace: ${err.message}`);
    throw err;
  }
}

export type StoredTraceAnalysis = Pick<TraceAnalysisDto, 'sampleCount' | 'skippedLines' | 'points' | 'analysis' | 'problem'>;

/** A stored trace with its item's velocity factor and length: the analysis, or why there is none, and the plot. */
export function storedTraceAnalysis(
  text: string,
  opts: { velocityFactor: number | null; lengthM: number | null; units: LengthSystem },
): StoredTraceAnalysis {
  const trace = parseTraceCsv(text);
  const out: StoredTraceAnalysis = {
    sampleCount: trace.timeS.length,
    skippedLines: trace.skippedLines,
    points: { timeS: [], volts: [] },
    analysis: null,
    problem: null,
  };
  try {
    const a = analyseWaveform(trace, {
      velocityFactor: opts.velocityFactor ?? undefined,
      lengthM: opts.lengthM ?? undefined,
      units: opts.units,
    });
    out.analysis = {
      incidentTimeS: a.markers.incident.timeS,
      reflectionTimeS: a.markers.reflection?.timeS ?? null,
      roundTripNs: a.roundTripNs,
      polarity: a.polarity,
      reflectionCoefficient: a.reflectionCoefficient,
      riseTimeNs: a.riseTimeNs,
      sampleIntervalNs: a.sampleIntervalNs,
      distanceM: a.distanceM,
      uncertaintyM: a.uncertaintyM,
      message: a.message,
    };
  } catch (err) {
    if (!(err instanceof WaveformError)) throw err;
    out.problem = err.message;
  }
  // The plot keeps the samples around the automatic markers, so they sit on the drawn edges.
  const keep = out.analysis
    ? [out.analysis.incidentTimeS, ...(out.analysis.reflectionTimeS === null ? [] : [out.analysis.reflectionTimeS])]
    : [];
  out.points = decimateMinMax(trace.timeS, trace.volts, PLOT_MAX_POINTS, keep);
  return out;
}

/** Every job a worker runs, by name: its input and what it answers. */
export const jobs = {
  waveformAnswer: (a: { parcel: BytesParcel; charset: string | undefined; query: WaveformQuery; units: LengthSystem }) =>
    waveformAnswer(decodeTrace(readParcel(a.parcel), a.charset), a.query, a.units),
  checkTrace: (a: { bytes: Uint8Array }) => checkTrace(a.bytes),
  // Read here from the attachment's file: its bytes never pass through the event loop's heap.
  storedTraceAnalysis: (a: { path: string; velocityFactor: number | null; lengthM: number | null; units: LengthSystem }) =>
    storedTraceAnalysis(readFileSync(a.path, 'utf8'), a),
  // The workbook reader and the PDF renderer are large: loaded by a worker when it first needs them.
  readSheet: async (a: { bytes: Uint8Array; fileName: string; limits: SheetLimits }): Promise<Sheet> => {
    const { readSheet } = await import('../lib/spreadsheet');
    return readSheet(Buffer.from(a.bytes.buffer, a.bytes.byteOffset, a.bytes.byteLength), a.fileName, a.limits);
  },
  renderCertificatePdf: async (a: CertificateDocument): Promise<Uint8Array> => {
    const { renderCertificatePdf } = await import('../pdf/certificate-pdf');
    return renderCertificatePdf(a);
  },
  renderLabelSheet: async (a: LabelSheetDocument): Promise<Uint8Array> => {
    const { renderLabelSheet } = await import('../pdf/label-sheet');
    return renderLabelSheet(a);
  },
};
export type Jobs = typeof jobs;
export type JobName = keyof Jobs;
