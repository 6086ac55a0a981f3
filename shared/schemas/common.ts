import { z } from 'zod';

// Reusable field schemas that normalise what people type.
export const emailField = z
  .string({ error: 'An e-mail address is required.' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'That is not an e-mail address.' }));

// Characters that make a name read differently from what it is (Unicode TR #36 §2.4, "Bidirectional
// text spoofing"; CVE-2021-42574): C0 and C1 controls, DEL, the bidirectional marks, embeddings,
// overrides and isolates, zero-width space, word joiner and invisible operators, and the byte order
// mark. Zero-width (non-)joiners stay: some scripts need them to spell a name.
// eslint-disable-next-line no-control-regex
const INVISIBLE = /[\u0000-\u001f\u007f-\u009f\u061c\u200b\u200e\u200f\u202a-\u202e\u2060-\u2064\u2066-\u2069\ufeff]/g;
// Line and tab breaks become a space rather than joining the words beside them.
const BREAKS = /[\t\n\v\f\r\u0085\u2028\u2029]/g;

/** What a person typed as a name, without control or bidirectional-override characters. */
export function cleanTypedName(s: string): string {
  return s.replace(BREAKS, ' ').replace(INVISIBLE, '');
}

/**
 * A name a person types (strip, venue, position, event, item, person, profile): cleaned, NFC,
 * trimmed, then checked for length, so a name of nothing but invisible characters is "required".
 */
export function typedName(opts: { required: string; max: number; tooLong: string; min?: number; tooShort?: string }) {
  return z
    .string({ error: opts.required })
    .overwrite(cleanTypedName)
    .normalize('NFC')
    .trim()
    .min(opts.min ?? 1, opts.min ? (opts.tooShort ?? opts.required) : opts.required)
    .max(opts.max, opts.tooLong);
}

export const nameField = typedName({ required: 'A name is required.', max: 120, tooLong: 'Keep the name under 120 characters.' });

export const idField = z.uuid({ error: 'That is not a valid id.' });

/** A meter reading as typed (parsed later by shared/domain/units.ts); `required` says what to type. */
export function meterValueField(required: string) {
  return z.string({ error: required }).trim().min(1, { error: required }).max(40, { error: 'value is too long for a meter reading' });
}

/** When the tablet says something was done (its clock, ISO 8601 with an offset); absent: on arrival. */
export const takenAtField = z.iso
  .datetime({ offset: true, error: 'takenAt must be a date and time in ISO 8601, e.g. 2026-11-14T07:05:00Z' })
  .nullable()
  .optional();

export const ROLES = ['admin', 'organiser', 'director', 'technician'] as const;
export const roleField = z.enum(ROLES, { error: 'The role must be admin, organiser, director or technician.' });
export type Role = z.infer<typeof roleField>;

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  organiser: 'Organiser',
  director: 'Technical director',
  technician: 'Technician',
};
