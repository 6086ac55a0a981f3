import { z } from 'zod';
import { EQUIPMENT_KINDS, TEST_KINDS, type TestKind } from '../domain/limits';
import { cleanTypedName, idField, nameField, typedName } from './common';
import { assetTagField } from './equipment';
import { canonicalTimeZone } from '../format/date-time';

const isoDate = (field: string) =>
  z
    .string({ error: `${field} is required (YYYY-MM-DD).` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${field} must be a date like 2026-11-21.`)
    .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), {
      message: `${field} is not a real date.`,
    });

export const createEventSchema = z
  .strictObject({
    name: nameField,
    startsOn: isoDate('startsOn'),
    endsOn: isoDate('endsOn'),
    organiserId: idField.nullable().optional(),
  })
  .refine((v) => v.endsOn >= v.startsOn, { path: ['endsOn'], message: 'The event cannot end before it starts.' });
export type CreateEventInput = z.input<typeof createEventSchema>;

/** An IANA time zone the engine knows ("Europe/Paris"), kept as Intl spells it. */
export const timeZoneField = z
  .string({ error: 'timeZone is required, as an IANA name like Europe/Paris.' })
  .trim()
  .transform((v, ctx) => {
    const zone = canonicalTimeZone(v);
    if (zone) return zone;
    ctx.addIssue({ code: 'custom', message: `${v.slice(0, 64)} is not a time zone this server knows; give an IANA name like Europe/Paris.` });
    return z.NEVER;
  });

export const createVenueSchema = z.strictObject({
  name: nameField,
  profileId: idField,
  /** Absent: the cloned venue's, else DEFAULT_TIME_ZONE. */
  timeZone: timeZoneField.optional(),
  cloneFromVenueId: idField.nullable().optional(),
  /** With a clone: also assign the same technicians. */
  copyTechnicians: z.boolean().optional(),
  /** With a clone: put the same tagged items in the same positions (default yes). */
  copyEquipment: z.boolean().optional(),
});
export type CreateVenueInput = z.input<typeof createVenueSchema>;

export const updateVenueSchema = z
  .strictObject({ name: nameField.optional(), profileId: idField.optional(), timeZone: timeZoneField.optional() })
  .refine((v) => v.name !== undefined || v.profileId !== undefined || v.timeZone !== undefined, {
    message: 'Nothing to change: give name, profileId or timeZone.',
  });
export type UpdateVenueInput = z.input<typeof updateVenueSchema>;

const positionName = typedName({ required: 'A position needs a name.', max: 60, tooLong: 'Keep position names under 60 characters.' });
const positionKind = z.enum(EQUIPMENT_KINDS, { error: `equipmentKind must be one of: ${EQUIPMENT_KINDS.join(', ')}` });

export const positionTemplateEntrySchema = z.strictObject({
  name: positionName,
  equipmentKind: positionKind,
  pisteOnly: z.boolean().optional(),
});

const stripLabel = typedName({ required: 'A strip needs a label.', max: 40, tooLong: 'Keep strip labels under 40 characters.' });
/** A row or area of the hall; empty means none. */
const zoneName = z.string().overwrite(cleanTypedName).normalize('NFC').trim().max(60, 'Keep zone names under 60 characters.');

export const bulkStripsSchema = z
  .strictObject({
    count: z.number().int('count must be a whole number.').min(1, 'Add at least 1 strip.').max(200, 'Add at most 200 strips at once.').optional(),
    labels: z.array(stripLabel).min(1, 'Give at least one label.').max(200, 'Add at most 200 strips at once.').optional(),
    prefix: z.string().overwrite(cleanTypedName).normalize('NFC').max(30, 'Keep the prefix under 30 characters.').optional(),
    startAt: z.number().int().min(0).max(9999).optional(),
    zone: zoneName.nullable().optional(),
    conductivePiste: z.boolean().optional(),
    template: z.array(positionTemplateEntrySchema).min(1, 'A template needs at least one position.').max(20).optional(),
  })
  .superRefine((v, ctx) => {
    if ((v.count === undefined) === (v.labels === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['count'], message: 'Give either count or labels.' });
    }
    if (v.labels) {
      const seen = new Set<string>();
      v.labels.forEach((l, i) => {
        if (seen.has(l)) ctx.addIssue({ code: 'custom', path: ['labels', i], message: `“${l}” is listed twice.` });
        seen.add(l);
      });
    }
  });
export type BulkStripsInput = z.input<typeof bulkStripsSchema>;

export const updateStripSchema = z
  .strictObject({
    label: stripLabel.optional(),
    zone: zoneName.nullable().optional(),
    sortOrder: z.number().int().min(0).max(100000).optional(),
    conductivePiste: z.boolean().optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change.' });
export type UpdateStripInput = z.input<typeof updateStripSchema>;

export const withdrawStripSchema = z.strictObject({
  reason: z.string({ error: 'Give a reason for withdrawing the strip.' }).trim().min(3, 'Give a reason for withdrawing the strip.').max(500),
});

export const attachEquipmentSchema = z.strictObject({ assetTag: assetTagField.nullable() });

/** One position added to one strip by hand; with an asset tag the item is attached at once. */
export const addPositionSchema = z.strictObject({
  name: positionName,
  equipmentKind: positionKind,
  assetTag: assetTagField.nullable().optional(),
});
export type AddPositionInput = z.input<typeof addPositionSchema>;
export type AddPositionValues = z.output<typeof addPositionSchema>;

export const venueTechniciansSchema = z.strictObject({
  userIds: z.array(idField).max(100).refine((ids) => new Set(ids).size === ids.length, { message: 'A person is listed twice.' }),
});

/** Which conductors a step of each test kind names. */
export const CONDUCTORS_FOR_TEST: Record<TestKind, readonly string[]> = {
  continuity: ['A', 'B', 'C'],
  insulation: ['A-B', 'A-C', 'B-C'],
  loop: ['A-B', 'A-C', 'B-C'],
  'piste-end-to-end': ['piste'],
  'piste-earth': ['piste-C'],
};

export const addStepSchema = z
  .strictObject({
    testKind: z.enum(TEST_KINDS, { error: `testKind must be one of: ${TEST_KINDS.join(', ')}` }),
    conductors: z.string({ error: 'conductors is required, e.g. "A" or "A-B".' }).trim(),
    required: z.boolean().optional(),
  })
  .superRefine((v, ctx) => {
    const allowed = CONDUCTORS_FOR_TEST[v.testKind];
    if (!allowed.includes(v.conductors)) {
      ctx.addIssue({ code: 'custom', path: ['conductors'], message: `A ${v.testKind} step names one of: ${allowed.join(', ')}.` });
    }
  });
export type AddStepInput = z.input<typeof addStepSchema>;
