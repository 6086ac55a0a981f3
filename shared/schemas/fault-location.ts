// Body of POST /api/fault-location: one object per method, told apart by `method`.
// Objects are strict so a mistyped field name is reported rather than silently ignored.

import { z } from 'zod';

const FAULT_LOCATION_METHODS = ['tdr', 'vf-calibration', 'loop-one-end', 'loop-both-ends', 'murray', 'capacitance', 'flex'] as const;

// No cable, resistance, capacitance (nF) or delay (ns) in this trade comes near 10^9: bigger is a typo,
// and would overflow the arithmetic to Infinity.
const MAX_INPUT = 1e9;

function positive(field: string, what: string) {
  return z
    .number({
      error: (issue) => (issue.input === undefined ? `${field} is required (${what})` : `${field} must be a number (${what})`),
    })
    .positive({ error: `${field} must be greater than 0 (${what})` })
    .max(MAX_INPUT, { error: `${field} is too large to be a real reading (${what})` });
}

function nonNegative(field: string, what: string) {
  return z
    .number({
      error: (issue) => (issue.input === undefined ? `${field} is required (${what})` : `${field} must be a number (${what})`),
    })
    .min(0, { error: `${field} cannot be negative (${what})` })
    .max(MAX_INPUT, { error: `${field} is too large to be a real reading (${what})` });
}

const velocityFactor = positive('velocityFactor', 'the cable’s velocity factor, e.g. 0.66').max(1, {
  error: 'velocityFactor cannot be more than 1: nothing travels faster than light',
});

export const tdrRequestSchema = z.strictObject({
  method: z.literal('tdr'),
  roundTripNs: positive('roundTripNs', 'time from the incident edge to the reflection, in ns'),
  velocityFactor,
  riseTimeNs: nonNegative('riseTimeNs', 'rise time of the incident edge, in ns').optional(),
  lengthM: positive('lengthM', 'cable length in metres').optional(),
});

export const vfCalibrationRequestSchema = z.strictObject({
  method: z.literal('vf-calibration'),
  roundTripNs: positive('roundTripNs', 'time from the incident edge to the far-end reflection, in ns'),
  lengthM: positive('lengthM', 'length of the known-good cable in metres'),
});

export const loopOneEndRequestSchema = z
  .strictObject({
    method: z.literal('loop-one-end'),
    loopOhm: nonNegative('loopOhm', 'loop reading through the short, in Ω'),
    ohmPerMetre: positive('ohmPerMetre', 'resistance of one conductor per metre, in Ω/m').optional(),
    conductorOhm: positive('conductorOhm', 'end-to-end reading of one sound conductor, in Ω').optional(),
    faultOhm: nonNegative('faultOhm', 'the short’s own resistance, in Ω').optional(),
    lengthM: positive('lengthM', 'cable length in metres').optional(),
  })
  .superRefine((body, ctx) => {
    if (body.ohmPerMetre !== undefined && body.conductorOhm !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['conductorOhm'], message: 'Give ohmPerMetre or conductorOhm, not both' });
    } else if (body.ohmPerMetre === undefined && body.conductorOhm === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['ohmPerMetre'],
        message: 'Give ohmPerMetre, or conductorOhm (a sound conductor end to end) with lengthM',
      });
    } else if (body.conductorOhm !== undefined && body.lengthM === undefined) {
      ctx.addIssue({ code: 'custom', path: ['lengthM'], message: 'lengthM is required with conductorOhm' });
    }
  });

export const loopBothEndsRequestSchema = z
  .strictObject({
    method: z.literal('loop-both-ends'),
    nearOhm: nonNegative('nearOhm', 'loop reading from the near end, far end open, in Ω'),
    farOhm: nonNegative('farOhm', 'loop reading from the far end, near end open, in Ω'),
    lengthM: positive('lengthM', 'cable length in metres'),
    ohmPerMetre: positive('ohmPerMetre', 'resistance of one conductor per metre, in Ω/m').optional(),
    conductorOhm: positive('conductorOhm', 'end-to-end reading of one sound conductor, in Ω').optional(),
  })
  .superRefine((body, ctx) => {
    if (body.ohmPerMetre !== undefined && body.conductorOhm !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['conductorOhm'], message: 'Give ohmPerMetre or conductorOhm, not both' });
    } else if (body.ohmPerMetre === undefined && body.conductorOhm === undefined) {
      ctx.addIssue({ code: 'custom', path: ['ohmPerMetre'], message: 'Give ohmPerMetre or conductorOhm (a sound conductor end to end)' });
    }
  });

export const murrayRequestSchema = z.strictObject({
  method: z.literal('murray'),
  lengthM: positive('lengthM', 'cable length in metres'),
  ratioP: positive('ratioP', 'bridge arm on the faulty conductor’s side at balance'),
  ratioQ: positive('ratioQ', 'bridge arm on the sound conductor’s side at balance'),
});

export const capacitanceRequestSchema = z.strictObject({
  method: z.literal('capacitance'),
  lengthM: positive('lengthM', 'cable length in metres'),
  faultedNf: positive('faultedNf', 'broken conductor from the near end, in nF'),
  soundNf: positive('soundNf', 'a sound conductor over the whole length, in nF'),
  farFaultedNf: positive('farFaultedNf', 'broken conductor from the far end, in nF').optional(),
});

export const flexRequestSchema = z.strictObject({
  method: z.literal('flex'),
  distanceM: nonNegative('distanceM', 'distance from the named end, in metres'),
  lengthM: positive('lengthM', 'cable length in metres').optional(),
  uncertaintyM: positive('uncertaintyM', 'how precisely the spot was found, in metres').optional(),
});

export const faultLocationRequestSchema = z.discriminatedUnion(
  'method',
  [
    tdrRequestSchema,
    vfCalibrationRequestSchema,
    loopOneEndRequestSchema,
    loopBothEndsRequestSchema,
    murrayRequestSchema,
    capacitanceRequestSchema,
    flexRequestSchema,
  ],
  { error: `method must be one of: ${FAULT_LOCATION_METHODS.join(', ')}` },
);

export type FaultLocationRequest = z.infer<typeof faultLocationRequestSchema>;
export type FaultLocationMethod = FaultLocationRequest['method'];
export { FAULT_LOCATION_METHODS };

export const faultLocationAnswerSchema = z.object({
  method: z.string(),
  distanceM: z.number(),
  fromOtherEndM: z.number().optional(),
  uncertaintyM: z.number(),
  faultOhm: z.number().optional(),
  velocityFactor: z.number().optional(),
  explanation: z.string(),
});

export type FaultLocationAnswerBody = z.infer<typeof faultLocationAnswerSchema>;
