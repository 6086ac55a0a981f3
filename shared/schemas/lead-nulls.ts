// Body of POST /api/lead-nulls: a technician's test-lead null, made on the tablet (its id too, so a
// null set offline and sent again is recognised).
import { z } from 'zod';
import { idField } from './common';

// Control, zero-width and bidirectional-override characters never belong in a name a person types
// (the same set as attachment file names).
// eslint-disable-next-line no-control-regex
const INVISIBLE = /[\u0000-\u001f\u007f-\u009f\u200b-\u200f\u202a-\u202e\u2066-\u2069\ufeff]/g;

export const createLeadNullSchema = z.strictObject({
  id: idField,
  value: z
    .string({ error: 'value is required: what the leads read with their tips touching, e.g. 0.12' })
    .trim()
    .min(1, { error: 'value is required: what the leads read with their tips touching, e.g. 0.12' })
    .max(40, { error: 'value is too long for a meter reading' }),
  meter: z
    .string({ error: 'meter must be text: the meter’s name or asset tag' })
    .transform((s) => s.replace(INVISIBLE, '').trim())
    .pipe(z.string().max(80, { error: 'meter must be under 80 characters' }))
    .nullable()
    .optional(),
  takenAt: z.iso
    .datetime({ offset: true, error: 'takenAt must be a date and time in ISO 8601, e.g. 2026-11-14T07:05:00Z' })
    .nullable()
    .optional(),
});
export type CreateLeadNullInput = z.infer<typeof createLeadNullSchema>;

/** A recorded test-lead null, as the API answers it. */
export const leadNullDtoSchema = z.strictObject({
  id: z.string(),
  valueText: z.string(),
  valueOhm: z.number(),
  meter: z.string().nullable(),
  takenAt: z.string(),
  receivedAt: z.string(),
  takenBy: z.string(),
  takenByName: z.string().nullable(),
});
export type LeadNullDto = z.infer<typeof leadNullDtoSchema>;

/**
 * A test-lead null as the tablet keeps it for the session and sends it. Its id is made when it is
 * set, so sending it again is a replay; a reading queued offline carries the null it uses, which
 * is sent before it.
 */
export interface LeadNullRecord {
  id: string;
  /** As typed, e.g. `0.12`. */
  value: string;
  valueOhm: number;
  meter: string | null;
  takenAt: string;
  /** Who set it: on a shared tablet, one person's null is never used for another's readings. */
  userId: string;
}
