// Body of POST /api/readings. The client makes the id (a UUID) so a retry is recognised.
import { z } from 'zod';
import { idField, meterValueField, takenAtField } from './common';
import { TEMPERATURE_RANGE_C } from '../domain/limits';

/** A correction must say what was wrong in a few words (e.g. “typed 3.4 for 0.34”). */
export const CORRECTION_REASON_MIN = 10;

export const createReadingSchema = z
  .strictObject({
    id: idField,
    stepId: idField,
    value: meterValueField('value is required: the reading as the meter shows it, e.g. 0.8, 22 MΩ or OL'),
    // The test-lead null this reading was typed with (POST /api/lead-nulls); its value is
    // subtracted. Null or absent: nothing is subtracted.
    leadNullId: idField.nullable().optional(),
    // Readings once carried the offset itself. Refused when it is a number, so no reading is judged
    // with an offset nobody recorded; null (no offset) is accepted from older tablets.
    leadOffsetOhm: z.unknown().optional(),
    temperatureC: z
      .number({ error: 'temperatureC must be a number of °C' })
      .min(TEMPERATURE_RANGE_C.min, { error: `temperatureC must be at least ${TEMPERATURE_RANGE_C.min} °C` })
      .max(TEMPERATURE_RANGE_C.max, { error: `temperatureC must be at most ${TEMPERATURE_RANGE_C.max} °C` })
      .nullable()
      .optional(),
    // When the technician typed it (the tablet's clock, ISO 8601): a reading sent later from the
    // offline queue still counts at that time, within limits (shared/domain/reading-time.ts).
    takenAt: takenAtField,
    supersedesId: idField.nullable().optional(),
    correctionReason: z
      .string({ error: 'correctionReason must be text' })
      .trim()
      .min(CORRECTION_REASON_MIN, {
        error: `correctionReason needs at least ${CORRECTION_REASON_MIN} characters: say what was wrong, e.g. “typed 3.4 for 0.34”`,
      })
      .max(500, { error: 'correctionReason must be under 500 characters' })
      .nullable()
      .optional(),
  })
  .superRefine((body, ctx) => {
    if (body.leadOffsetOhm !== undefined && body.leadOffsetOhm !== null) {
      ctx.addIssue({
        code: 'custom',
        path: ['leadOffsetOhm'],
        message:
          'leadOffsetOhm is no longer taken with a reading: record the test-lead null (POST /api/lead-nulls) and send its id as leadNullId',
      });
    }
    const hasSupersedes = body.supersedesId != null;
    const hasReason = body.correctionReason != null;
    if (hasSupersedes && !hasReason) {
      ctx.addIssue({ code: 'custom', path: ['correctionReason'], message: 'A correction needs a reason (correctionReason)' });
    }
    if (hasReason && !hasSupersedes) {
      ctx.addIssue({
        code: 'custom',
        path: ['supersedesId'],
        message: 'correctionReason goes with supersedesId: the reading being corrected',
      });
    }
  });
export type CreateReadingInput = z.infer<typeof createReadingSchema>;

export const VERDICTS = ['pass', 'near-limit', 'fail'] as const;
export type VerdictName = (typeof VERDICTS)[number];

/** Readings per POST /api/readings/batch: a tablet's hour offline is a few hundred, sent in turns. */
export const READINGS_BATCH_MAX = 200;

/**
 * Body of POST /api/readings/batch. Each reading is checked against createReadingSchema on its own,
 * so one bad reading is refused alone (its result says why) and the others are recorded.
 */
export const readingsBatchSchema = z.strictObject({
  readings: z
    .array(z.unknown(), { error: 'readings must be a list of readings, each the body of POST /api/readings' })
    .min(1, { error: 'readings needs at least one reading' })
    .max(READINGS_BATCH_MAX, { error: `Send at most ${READINGS_BATCH_MAX} readings at once` }),
});

/** A stored reading as the API answers it. */
export const readingDtoSchema = z.strictObject({
  id: z.string(),
  stepId: z.string(),
  equipmentId: z.string().nullable(),
  valueText: z.string(),
  valueOhm: z.number().nullable(),
  overRange: z.boolean(),
  /** The test-lead null subtracted from what was typed (0 or null: none). */
  leadOffsetOhm: z.number().nullable(),
  leadNullId: z.string().nullable(),
  temperatureC: z.number().nullable(),
  verdict: z.enum(VERDICTS),
  limitOhm: z.number().nullable(),
  limitKind: z.enum(['max', 'min']).nullable(),
  source: z.string(),
  ruleId: z.string().nullable(),
  profileId: z.string(),
  profileVersion: z.number().int(),
  explanation: z.string(),
  supersedesId: z.string().nullable(),
  correctionReason: z.string().nullable(),
  /** When it counts: the tablet's time when typed (within limits), else when it arrived. */
  takenAt: z.string(),
  /** When the server received it; null on readings stored before this was kept. */
  receivedAt: z.string().nullable(),
  takenBy: z.string(),
  takenByName: z.string().nullable(),
  faultId: z.string().nullable().optional(),
  /** Only in the answer to POST /api/readings: this reading put its strip out of service (signed-off venue). */
  stripSuspended: z.boolean().optional(),
});
export type ReadingDto = z.infer<typeof readingDtoSchema>;

/** The problem+json body a refused reading would have had on its own. */
export const problemBodySchema = z.looseObject({
  type: z.string(),
  title: z.string(),
  status: z.number().int(),
  code: z.string(),
  detail: z.string(),
  errors: z.array(z.strictObject({ path: z.string(), message: z.string() })).optional(),
});
export type ProblemBody = z.infer<typeof problemBodySchema>;

/** One reading's outcome in a batch, in the order sent: the status and body it would have had alone. */
export const readingBatchResultSchema = z.strictObject({
  /** The reading's id as sent (null when it had none that could be read). */
  id: z.string().nullable(),
  status: z.number().int(),
  reading: readingDtoSchema.optional(),
  problem: problemBodySchema.optional(),
});
export type ReadingBatchResult = z.infer<typeof readingBatchResultSchema>;
