import { z } from 'zod';
import { EQUIPMENT_KINDS } from '../domain/limits';
import { cleanTypedName } from './common';

/** Words that name or describe an item (shown in lists and on certificates): cleaned like a name. */
const itemText = (max: number, tooLong: string) => z.string().overwrite(cleanTypedName).normalize('NFC').trim().max(max, tooLong);

export const EQUIPMENT_STATUSES = ['in-service', 'under-repair', 'retired'] as const;
export type EquipmentStatus = (typeof EQUIPMENT_STATUSES)[number];

export const EQUIPMENT_KIND_LABELS: Record<(typeof EQUIPMENT_KINDS)[number], string> = {
  'floor-cable': 'Floor cable',
  reel: 'Reel',
  piste: 'Piste',
  'body-wire': 'Body wire',
  apparatus: 'Scoring apparatus',
  other: 'Other',
};
export const EQUIPMENT_STATUS_LABELS: Record<EquipmentStatus, string> = {
  'in-service': 'In service',
  'under-repair': 'Under repair',
  retired: 'Retired',
};

export const equipmentKindField = z.enum(EQUIPMENT_KINDS, {
  error: `The kind must be one of: ${EQUIPMENT_KINDS.join(', ')}.`,
});
export const equipmentStatusField = z.enum(EQUIPMENT_STATUSES, {
  error: `The status must be one of: ${EQUIPMENT_STATUSES.join(', ')}.`,
});

/** Asset tags are kept as printed on the label, upper-cased so "fc-001" and "FC-001" are one tag. */
export const assetTagField = z
  .string({ error: 'An asset tag is required.' })
  .trim()
  .toUpperCase()
  .min(1, 'An asset tag is required.')
  .max(40, 'Keep the asset tag under 40 characters.')
  .regex(/^[A-Z0-9][A-Z0-9._/-]*$/, 'Use letters, digits and - . / _ in an asset tag, e.g. FC-014.');

const positiveOrNull = (field: string, unit: string, max: number) =>
  z
    .number({ error: `${field} must be a number (${unit}).` })
    .positive(`${field} must be more than 0 ${unit}.`)
    .max(max, `${field} over ${max} ${unit} is not plausible.`)
    .nullable()
    .optional();

const equipmentFields = {
  kind: equipmentKindField,
  description: itemText(300, 'Keep the description under 300 characters.').optional(),
  lengthM: positiveOrNull('lengthM', 'm', 1000),
  conductorMm2: positiveOrNull('conductorMm2', 'mm²', 50),
  awg: z.number().int('awg must be a whole number.').min(0).max(40, 'awg must be between 0 and 40.').nullable().optional(),
  cableType: itemText(120, 'Keep the cable type under 120 characters.').nullable().optional(),
  velocityFactor: z
    .number({ error: 'velocityFactor must be a number between 0.3 and 1.' })
    .min(0.3, 'velocityFactor must be at least 0.3.')
    .max(1, 'velocityFactor cannot be above 1.')
    .nullable()
    .optional(),
  status: equipmentStatusField.optional(),
  notes: z.string().trim().max(2000).nullable().optional(),
};

export const createEquipmentSchema = z.strictObject({ assetTag: assetTagField, ...equipmentFields });
export type CreateEquipmentInput = z.input<typeof createEquipmentSchema>;

export const updateEquipmentSchema = z
  .strictObject({ assetTag: assetTagField.optional(), ...equipmentFields, kind: equipmentKindField.optional() })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change.' });
export type UpdateEquipmentInput = z.input<typeof updateEquipmentSchema>;

export const equipmentQuerySchema = z.object({
  kind: equipmentKindField.optional(),
  status: equipmentStatusField.optional(),
  q: z.string().trim().max(100).optional(),
});

export const calibrationSchema = z.strictObject({
  roundTripNs: z.number({ error: 'roundTripNs must be a number of nanoseconds.' }).positive('roundTripNs must be more than 0 ns.'),
  lengthM: z.number({ error: 'lengthM must be a number of metres.' }).positive('lengthM must be more than 0 m.').max(1000),
});
export type CalibrationInput = z.infer<typeof calibrationSchema>;
