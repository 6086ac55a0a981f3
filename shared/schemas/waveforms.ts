// Query of POST /api/waveforms/analyse (the body is the CSV trace itself; the answer is in
// shared/contracts/fault-location.ts).

import { z } from 'zod';

function optionalNumber(field: string, what: string) {
  return z.coerce
    .number({ error: `${field} must be a number (${what})` })
    .refine(Number.isFinite, { error: `${field} must be a number (${what})` })
    .optional();
}

export const waveformQuerySchema = z.strictObject({
  velocityFactor: optionalNumber('velocityFactor', 'the cable’s velocity factor, e.g. 0.66').refine(
    (v) => v === undefined || (v >= 0.3 && v <= 1),
    {
      error: 'velocityFactor must be between 0.3 and 1 (e.g. 0.66 for PVC multi-core, 0.7 for PTFE coax)',
    },
  ),
  lengthM: optionalNumber('lengthM', 'cable length in metres').refine((v) => v === undefined || v > 0, {
    error: 'lengthM must be greater than 0 (cable length in metres)',
  }),
});

export type WaveformQuery = z.infer<typeof waveformQuerySchema>;

/** Largest CSV accepted: 2 million samples of a verbose export fit comfortably. */
export const WAVEFORM_MAX_BYTES = 64 * 1024 * 1024;
export const WAVEFORM_CONTENT_TYPES = ['text/csv', 'text/plain', 'application/octet-stream'] as const;
