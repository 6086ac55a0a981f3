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

// By hand a fault is only marked open or located: it becomes repaired by recording a repair, and
// closes by a passing retest or the director's dismissal, never by an edit.
const EDITABLE_STATUSES = ['open', 'located'] as const;

export const updateFaultSchema = z
  .strictObject({
    notes: notes.nullable().optional(),
    kind: faultKind.optional(),
    status: z
      .enum(EDITABLE_STATUSES, {
        error:
          'status can be set to open or located; a fault is repaired by recording a repair, and closes when its retest passes or the technical director dismisses it',
      })
      .optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change: give notes, kind or status.' });
export type UpdateFaultInput = z.infer<typeof updateFaultSchema>;

export const fromEndSchema = z.enum(['near', 'far'], { error: 'fromEnd must be near (the apparatus end) or far' });

export const createRepairSchema = z
  .strictObject({
    action: z.enum(REPAIR_ACTIONS, { error: `action must be one of: ${REPAIR_ACTIONS.join(', ')}` }),
    lengthRemovedM: z
      .number({ error: 'lengthRemovedM must be a number of metres' })
      .positive({ error: 'lengthRemovedM must be more than 0 m' })
      .optional(),
    replacementAssetTag: z.string().trim().min(1, { error: 'replacementAssetTag is required for a swap' }).max(60).optional(),
    notes: notes.optional(),
  })
  .superRefine((body, ctx) => {
    if (body.action === 'cut-out' && body.lengthRemovedM === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['lengthRemovedM'],
        message: 'lengthRemovedM is required for a cut-out: how much cable was cut away',
      });
    }
    if (body.action !== 'cut-out' && body.lengthRemovedM !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['lengthRemovedM'], message: 'lengthRemovedM only goes with a cut-out' });
    }
    if (body.action === 'swapped' && body.replacementAssetTag === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['replacementAssetTag'],
        message: 'replacementAssetTag is required for a swap: the asset tag of the item put in',
      });
    }
    if (body.action !== 'swapped' && body.replacementAssetTag !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['replacementAssetTag'], message: 'replacementAssetTag only goes with a swap' });
    }
  });
export type CreateRepairInput = z.infer<typeof createRepairSchema>;

/** A dismissal must say why in at least a sentence: it is printed on the certificate. */
export const DISMISSAL_REASON_MIN = 20;

export const dismissFaultSchema = z.strictObject({
  reason: z
    .string({ error: 'reason is required: why this fault was a typing mistake' })
    .trim()
    .min(DISMISSAL_REASON_MIN, {
      error: `reason needs at least ${DISMISSAL_REASON_MIN} characters: say in a sentence why this fault was a typing mistake (it is kept in the audit trail and printed on the certificate)`,
    })
    .max(1000, { error: 'reason must be under 1000 characters' }),
});
export type DismissFaultInput = z.infer<typeof dismissFaultSchema>;
