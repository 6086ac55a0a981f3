import { z } from 'zod';
import { contract, json, textBody } from './contract';
import { faultLocationAnswerSchema, faultLocationRequestSchema } from '../schemas/fault-location';
import { WAVEFORM_CONTENT_TYPES, WAVEFORM_MAX_BYTES, waveformQuerySchema } from '../schemas/waveforms';

const point = z.strictObject({ timeS: z.number(), volts: z.number() });

/** The waveform engine's analysis of a trace, the estimate without its echo of inputs, and a plot-sized trace. */
export const waveformAnswerSchema = z.strictObject({
  markers: z.strictObject({
    incident: point,
    reflection: point.nullable(),
    /** Pre-edge baseline fitted as a line: volts = interceptV + slopeVPerS · t. */
    baseline: z.strictObject({ interceptV: z.number(), slopeVPerS: z.number() }),
    levels: z.strictObject({ baselineV: z.number(), incidentV: z.number(), reflectedV: z.number().nullable() }),
  }),
  roundTripNs: z.number().nullable(),
  polarity: z.enum(['open', 'short']).nullable(),
  reflectionCoefficient: z.number().nullable(),
  incidentStepV: z.number(),
  reflectedStepV: z.number().nullable(),
  riseTimeNs: z.number(),
  sampleIntervalNs: z.number(),
  noiseV: z.number(),
  estimate: faultLocationAnswerSchema.nullable(),
  distanceM: z.number().nullable(),
  uncertaintyM: z.number().nullable(),
  message: z.string(),
  sampleCount: z.number().int(),
  skippedLines: z.number().int(),
  /** Min/max-decimated copy of the trace for plotting; the analysis used every sample. */
  plot: z.strictObject({ timeS: z.array(z.number()), volts: z.array(z.number()) }),
});

export type WaveformAnswer = z.infer<typeof waveformAnswerSchema>;

/** Pure computation, no database: any signed-in user may ask where a fault is. */
export const faultLocationContracts = {
  /** The explanation is worded in the asker's units; the numbers are always metres. */
  locate: contract({
    method: 'POST',
    path: '/fault-location',
    access: 'signed-in',
    body: faultLocationRequestSchema,
    answer: json(faultLocationAnswerSchema),
  }),
  /** The trace is the body itself (a scope's CSV export), far over the 100 kB JSON limit. */
  analyse: contract({
    method: 'POST',
    path: '/waveforms/analyse',
    access: 'signed-in',
    query: waveformQuerySchema,
    body: textBody(WAVEFORM_CONTENT_TYPES, WAVEFORM_MAX_BYTES, 'the trace'),
    answer: json(waveformAnswerSchema),
  }),
};
