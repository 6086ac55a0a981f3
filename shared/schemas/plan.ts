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
    ctx.addIssue({
      code: 'custom',
      message: `${v.slice(0, 64)} is not a time zone this server knows; give an IANA name like Europe/Paris.`,
    });
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

const technicianIds = z
  .array(idField)
  .max(100)
  .refine((ids) => new Set(ids).size === ids.length, { message: 'A person is listed twice.' });

/** The venue's details; with technicianIds also who tests it, so the venue form saves once. */
export const updateVenueSchema = z
  .strictObject({
    name: nameField.optional(),
    profileId: idField.optional(),
    timeZone: timeZoneField.optional(),
    technicianIds: technicianIds.optional(),
  })
  .refine((v) => v.name !== undefined || v.profileId !== undefined || v.timeZone !== undefined || v.technicianIds !== undefined, {
    message: 'Nothing to change: give name, profileId, timeZone or technicianIds.',
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
    count: z
      .number()
      .int('count must be a whole number.')
      .min(1, 'Add at least 1 strip.')
      .max(200, 'Add at most 200 strips at once.')
      .optional(),
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

/**
 * Asset tags for many positions of one venue at once (a strip, a row, or any set): one entry per
 * position, null takes the item off. A tag or a position listed twice is refused before anything
 * is looked up, so a pasted column with a repeated tag says which rows repeat it.
 */
export const assetTagRows = z
  .array(z.strictObject({ positionId: idField, assetTag: assetTagField.nullable() }), { error: 'Give a list of positions and tags.' })
  .min(1, 'Give at least one position.')
  .max(500, 'Give at most 500 positions at once.')
  .superRefine((rows, ctx) => {
    const byTag = new Map<string, number>();
    const byPosition = new Set<string>();
    rows.forEach((p, i) => {
      if (byPosition.has(p.positionId)) {
        ctx.addIssue({ code: 'custom', path: [i, 'positionId'], message: `Row ${i + 1} names a position that is listed already.` });
      }
      byPosition.add(p.positionId);
      if (p.assetTag === null) return;
      const first = byTag.get(p.assetTag);
      if (first !== undefined) {
        ctx.addIssue({
          code: 'custom',
          path: [i, 'assetTag'],
          message: `${p.assetTag} is given twice (rows ${first + 1} and ${i + 1}); one item can sit in one position only.`,
        });
      } else byTag.set(p.assetTag, i);
    });
  });
export const assetTagsSchema = z.strictObject({ positions: assetTagRows });
export type AssetTagsInput = z.input<typeof assetTagsSchema>;
export type AssetTagsValues = z.output<typeof assetTagsSchema>;

export const updateStripSchema = z
  .strictObject({
    label: stripLabel.optional(),
    zone: zoneName.nullable().optional(),
    sortOrder: z.number().int().min(0).max(100000).optional(),
    conductivePiste: z.boolean().optional(),
    /** The strip card saves its details and its asset-tag table in one edit. */
    assetTags: assetTagRows.optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change.' });
export type UpdateStripInput = z.input<typeof updateStripSchema>;
export type UpdateStripValues = z.output<typeof updateStripSchema>;

export const withdrawStripSchema = z.strictObject({
  reason: z
    .string({ error: 'Give a reason for withdrawing the strip.' })
    .trim()
    .min(3, 'Give a reason for withdrawing the strip.')
    .max(500),
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

export const venueTechniciansSchema = z.strictObject({ userIds: technicianIds });

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
