// Faults: manual records, edits, location estimates and repairs.
import { z } from 'zod';
import { idField } from './common';

export const FAULT_KINDS = ['short', 'open', 'high-resistance', 'intermittent'] as const;
export const FAULT_STATUSES = ['open', 'located', 'repaired', 'closed'] as const;
export const REPAIR_ACTIONS = ['cut-out', 'connector-remade', 'swapped', 'retired'] as const;
export type FaultKind = (typeof FAULT_KINDS)[number];
export type FaultStatus = (typeof FAULT_STATUSES)[number];
export type RepairAction = (typeof REPAIR_ACTIONS)[number];

export const FAULT_KIND_LABELS: Record<FaultKind, string> = {
  short: 'Short between lines',
  open: 'Open line',
  'high-resistance': 'High resistance',
  intermittent: 'Intermittent',
};
export const FAULT_STATUS_LABELS: Record<FaultStatus, string> = {
  open: 'Open',
  located: 'Located',
  repaired: 'Repaired, retest due',
  closed: 'Closed',
};

const faultKind = z.enum(FAULT_KINDS, { error: `kind must be one of: ${FAULT_KINDS.join(', ')}` });
const conductors = z
  .string({ error: 'conductors is required, e.g. A, A-B or piste' })
  .trim()
  .regex(/^(?:[ABC](?:-[ABC])?|piste(?:-C)?)$/, { error: 'conductors must be a line (A, B, C), a pair (A-B, A-C, B-C) or piste' });
const notes = z.string().trim().max(2000, { error: 'notes must be under 2000 characters' });

export const createFaultSchema = z.strictObject({
  positionId: idField,
  stepId: idField.optional(),
  kind: faultKind,
  conductors,
  notes: notes.optional(),
});
export type CreateFaultInput = z.infer<typeof createFaultSchema>;

export const updateFaultSchema = z
  .strictObject({
    notes: notes.nullable().optional(),
    kind: faultKind.optional(),
    status: z.enum(FAULT_STATUSES, { error: `status must be one of: ${FAULT_STATUSES.join(', ')}` }).optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change: give notes, kind or status.' });
export type UpdateFaultInput = z.infer<typeof updateFaultSchema>;

export const fromEndSchema = z.enum(['near', 'far'], { error: 'fromEnd must be near (the apparatus end) or far' });

export const createRepairSchema = z
  .strictObject({
    action: z.enum(REPAIR_ACTIONS, { error: `action must be one of: ${REPAIR_ACTIONS.join(', ')}` }),
    lengthRemovedM: z.number({ error: 'lengthRemovedM must be a number of metres' }).positive({ error: 'lengthRemovedM must be more than 0 m' }).optional(),
    replacementAssetTag: z.string().trim().min(1, { error: 'replacementAssetTag is required for a swap' }).max(60).optional(),
    notes: notes.optional(),
  })
  .superRefine((body, ctx) => {
    if (body.action === 'cut-out' && body.lengthRemovedM === undefined) {
      ctx.addIssue({ code: 'custom', path: ['lengthRemovedM'], message: 'lengthRemovedM is required for a cut-out: how much cable was cut away' });
    }
    if (body.action !== 'cut-out' && body.lengthRemovedM !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['lengthRemovedM'], message: 'lengthRemovedM only goes with a cut-out' });
    }
    if (body.action === 'swapped' && body.replacementAssetTag === undefined) {
      ctx.addIssue({ code: 'custom', path: ['replacementAssetTag'], message: 'replacementAssetTag is required for a swap: the asset tag of the item put in' });
    }
    if (body.action !== 'swapped' && body.replacementAssetTag !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['replacementAssetTag'], message: 'replacementAssetTag only goes with a swap' });
    }
  });
export type CreateRepairInput = z.infer<typeof createRepairSchema>;
