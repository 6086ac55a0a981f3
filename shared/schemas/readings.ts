// Body of POST /api/readings. The client makes the id (a UUID) so a retry is recognised.
import { z } from 'zod';
import { idField } from './common';
import { LEAD_OFFSET_MAX_OHM } from '../domain/units';
import { TEMPERATURE_RANGE_C } from '../domain/limits';

export const createReadingSchema = z
  .strictObject({
    id: idField,
    stepId: idField,
    value: z
      .string({ error: 'value is required: the reading as the meter shows it, e.g. 0.8, 22 MΩ or OL' })
      .trim()
      .min(1, { error: 'value is required: the reading as the meter shows it, e.g. 0.8, 22 MΩ or OL' })
      .max(40, { error: 'value is too long for a meter reading' }),
    leadOffsetOhm: z
      .number({ error: 'leadOffsetOhm must be a number of ohms' })
      .min(0, { error: 'leadOffsetOhm cannot be negative' })
      .max(LEAD_OFFSET_MAX_OHM, { error: `leadOffsetOhm must be at most ${LEAD_OFFSET_MAX_OHM} Ω; null the leads again` })
      .nullable()
      .optional(),
    temperatureC: z
      .number({ error: 'temperatureC must be a number of °C' })
      .min(TEMPERATURE_RANGE_C.min, { error: `temperatureC must be at least ${TEMPERATURE_RANGE_C.min} °C` })
      .max(TEMPERATURE_RANGE_C.max, { error: `temperatureC must be at most ${TEMPERATURE_RANGE_C.max} °C` })
      .nullable()
      .optional(),
    // When the technician typed it (the tablet's clock, ISO 8601): a reading sent later from the
    // offline queue still counts at that time, within limits (shared/domain/reading-time.ts).
    takenAt: z.iso
      .datetime({ offset: true, error: 'takenAt must be a date and time in ISO 8601, e.g. 2026-11-14T07:05:00Z' })
      .nullable()
      .optional(),
    supersedesId: idField.nullable().optional(),
    correctionReason: z.string().trim().min(3, { error: 'correctionReason needs a few words' }).max(500).nullable().optional(),
  })
  .superRefine((body, ctx) => {
    const hasSupersedes = body.supersedesId != null;
    const hasReason = body.correctionReason != null;
    if (hasSupersedes && !hasReason) {
      ctx.addIssue({ code: 'custom', path: ['correctionReason'], message: 'A correction needs a reason (correctionReason)' });
    }
    if (hasReason && !hasSupersedes) {
      ctx.addIssue({ code: 'custom', path: ['supersedesId'], message: 'correctionReason goes with supersedesId: the reading being corrected' });
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
  leadOffsetOhm: z.number().nullable(),
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
  /** Only in the answer to POST /api/readings: this reading re-opened a signed-off venue. */
  venueReopened: z.boolean().optional(),
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
