// Body of POST /api/fault-location: one object per method, told apart by `method`, its fields
// built from the one definition of each method's inputs (shared/domain/fault-methods.ts).
// Objects are strict so a mistyped field name is reported rather than silently ignored.

import { z } from 'zod';
import { METHOD_DEFINITIONS, VF_CALIBRATION_INPUTS, type MethodInput } from '../domain/fault-methods';

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

type NumberInput = Pick<MethodInput, 'name' | 'required' | 'zeroAllowed' | 'quantity' | 'describe'>;
type Field<I extends NumberInput> = I['required'] extends true ? z.ZodNumber : z.ZodOptional<z.ZodNumber>;
type ShapeOf<Inputs extends readonly NumberInput[]> = { [I in Inputs[number] as I['name']]: Field<I> };

/** One input of shared/domain/fault-methods.ts as a zod number, with its name and sentence in every message. */
function fieldOf(input: NumberInput) {
  let field = input.zeroAllowed ? nonNegative(input.name, input.describe) : positive(input.name, input.describe);
  if (input.quantity === 'velocity-factor') {
    field = field.max(1, { error: `${input.name} cannot be more than 1: nothing travels faster than light` });
  }
  return input.required ? field : field.optional();
}

function shapeOf<const Inputs extends readonly NumberInput[]>(inputs: Inputs): ShapeOf<Inputs> {
  return Object.fromEntries(inputs.map((input) => [input.name, fieldOf(input)])) as ShapeOf<Inputs>;
}

export const tdrRequestSchema = z.strictObject({ method: z.literal('tdr'), ...shapeOf(METHOD_DEFINITIONS.tdr.inputs) });

export const vfCalibrationRequestSchema = z.strictObject({ method: z.literal('vf-calibration'), ...shapeOf(VF_CALIBRATION_INPUTS) });

export const loopOneEndRequestSchema = z
  .strictObject({ method: z.literal('loop-one-end'), ...shapeOf(METHOD_DEFINITIONS['loop-one-end'].inputs) })
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
  .strictObject({ method: z.literal('loop-both-ends'), ...shapeOf(METHOD_DEFINITIONS['loop-both-ends'].inputs) })
  .superRefine((body, ctx) => {
    if (body.ohmPerMetre !== undefined && body.conductorOhm !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['conductorOhm'], message: 'Give ohmPerMetre or conductorOhm, not both' });
    } else if (body.ohmPerMetre === undefined && body.conductorOhm === undefined) {
      ctx.addIssue({ code: 'custom', path: ['ohmPerMetre'], message: 'Give ohmPerMetre or conductorOhm (a sound conductor end to end)' });
    }
  });

/** The arm joined to the faulted line and the arm joined to the sound line: named so the wiring cannot be misread. */
export const murrayRequestSchema = z.strictObject({ method: z.literal('murray'), ...shapeOf(METHOD_DEFINITIONS.murray.inputs) });

export const capacitanceRequestSchema = z.strictObject({
  method: z.literal('capacitance'),
  ...shapeOf(METHOD_DEFINITIONS.capacitance.inputs),
});

export const flexRequestSchema = z.strictObject({ method: z.literal('flex'), ...shapeOf(METHOD_DEFINITIONS.flex.inputs) });

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
