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
