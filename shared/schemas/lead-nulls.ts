// Body of POST /api/lead-nulls: a technician's test-lead null, made on the tablet (its id too, so a
// null set offline and sent again is recognised).
import { z } from 'zod';
import { cleanTypedName, idField, meterValueField, takenAtField } from './common';

export const createLeadNullSchema = z.strictObject({
  id: idField,
  value: meterValueField('value is required: what the leads read with their tips touching, e.g. 0.12'),
  meter: z
    .string({ error: 'meter must be text: the meter’s name or asset tag' })
    .transform((s) => cleanTypedName(s).trim())
    .pipe(z.string().max(80, { error: 'meter must be under 80 characters' }))
    .nullable()
    .optional(),
  takenAt: takenAtField,
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
