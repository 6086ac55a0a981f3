import { z } from 'zod';
import { contract, json, KEEPERS, STAFF } from './contract';
import { equipmentKind, equipmentStatus, faultKind, faultStatus, testKind } from './common';
import { idParams } from '../schemas/params';
import { VERDICTS } from '../schemas/readings';
import { REPAIR_ACTIONS } from '../schemas/faults';
import { calibrationSchema, createEquipmentSchema, equipmentQuerySchema, updateEquipmentSchema } from '../schemas/equipment';

/** A register item. Sent with ETag = its version; an edit sends it back in If-Match. */
export const equipmentItemSchema = z.strictObject({
  id: z.string(),
  orgId: z.string(),
  assetTag: z.string(),
  kind: equipmentKind,
  description: z.string(),
  lengthM: z.number().nullable(),
  conductorMm2: z.number().nullable(),
  awg: z.number().int().nullable(),
  cableType: z.string().nullable(),
  velocityFactor: z.number().nullable(),
  status: equipmentStatus,
  notes: z.string().nullable(),
  version: z.number().int(),
  createdAt: z.string(),
  /** "To inspect": taken out of a strip during this incident; cleared when someone sets its status. */
  toInspectIncidentId: z.string().nullable(),
});
export type EquipmentItem = z.infer<typeof equipmentItemSchema>;

const where = { stripLabel: z.string(), venueId: z.string(), venueName: z.string(), eventName: z.string() };

/** The item with everything that happened to it, across events. */
export const equipmentDetailSchema = z.strictObject({
  item: equipmentItemSchema,
  /** The length before the first section was cut out; null when nothing was ever cut. */
  originalLengthM: z.number().nullable(),
  lengthRemovedM: z.number(),
  readings: z.array(
    z.strictObject({
      id: z.string(),
      valueText: z.string(),
      valueOhm: z.number().nullable(),
      verdict: z.enum(VERDICTS),
      limitOhm: z.number().nullable(),
      testKind,
      conductors: z.string(),
      positionName: z.string(),
      stripId: z.string(),
      ...where,
      takenAt: z.string(),
      takenByName: z.string().nullable(),
      supersedesId: z.string().nullable(),
    }),
  ),
  faults: z.array(
    z.strictObject({
      id: z.string(),
      stripId: z.string(),
      positionId: z.string(),
      equipmentId: z.string().nullable(),
      stepId: z.string().nullable(),
      readingId: z.string().nullable(),
      kind: faultKind,
      conductors: z.string(),
      status: faultStatus,
      notes: z.string().nullable(),
      version: z.number().int(),
      openedBy: z.string(),
      openedAt: z.string(),
      closedAt: z.string().nullable(),
      /** Closed by the event's director as a typing mistake. */
      dismissedAt: z.string().nullable(),
      dismissedBy: z.string().nullable(),
      dismissedReason: z.string().nullable(),
      positionName: z.string(),
      ...where,
    }),
  ),
  repairs: z.array(
    z.strictObject({
      id: z.string(),
      faultId: z.string(),
      equipmentId: z.string().nullable(),
      action: z.enum(REPAIR_ACTIONS),
      lengthRemovedM: z.number().nullable(),
      lengthBeforeM: z.number().nullable(),
      replacementEquipmentId: z.string().nullable(),
      notes: z.string().nullable(),
      createdBy: z.string(),
      createdAt: z.string(),
      byName: z.string().nullable(),
      /** repaired: this item was worked on; replacement: it was put in for another one. */
      role: z.enum(['repaired', 'replacement']),
      lengthAfterM: z.number().nullable(),
    }),
  ),
  placements: z.array(
    z.strictObject({
      id: z.string(),
      assignedAt: z.string(),
      removedAt: z.string().nullable(),
      positionName: z.string(),
      stripId: z.string(),
      ...where,
      eventId: z.string(),
    }),
  ),
  /** Incidents on the strips this item was in, across events (the item in the position, removed or put in). */
  incidents: z.array(
    z.strictObject({
      id: z.string(),
      ...where,
      stripId: z.string(),
      positionName: z.string().nullable(),
      symptom: z.string(),
      status: z.enum(['open', 'resolved']),
      openedAt: z.string(),
      resolvedAt: z.string().nullable(),
      minutesOutOfService: z.number().int(),
      /** in-position: it was there when the incident opened; removed: swapped out; installed: the spare put in. */
      role: z.enum(['in-position', 'removed', 'installed']),
    }),
  ),
  /** Flagged for inspection after repeated incidents (REPEATED_INCIDENTS in schemas/incidents, common practice). */
  inspection: z.strictObject({
    /** Repeated incidents (at least REPEATED_INCIDENTS) or taken out during one and not looked at since. */
    flagged: z.boolean(),
    repeatedIncidents: z.boolean(),
    toInspect: z.boolean(),
    incidentCount: z.number().int(),
    /** A sentence for the register page; null when not flagged. */
    reason: z.string().nullable(),
  }),
  calibrations: z.array(
    z.strictObject({
      id: z.string(),
      equipmentId: z.string(),
      velocityFactor: z.number(),
      lengthM: z.number(),
      roundTripNs: z.number(),
      createdBy: z.string().nullable(),
      createdAt: z.string(),
      byName: z.string().nullable(),
    }),
  ),
});
export type EquipmentDetail = z.infer<typeof equipmentDetailSchema>;

/** A velocity-factor calibration on a known-good cable, and the item with its new factor. */
export const calibrationResultSchema = z.strictObject({
  id: z.string(),
  velocityFactor: z.number(),
  velocityFactorUncertainty: z.number(),
  delayNsPerMetre: z.number(),
  explanation: z.string(),
  inputs: z.record(z.string(), z.number()),
  item: equipmentItemSchema,
});

export const equipmentContracts = {
  list: contract({
    method: 'GET',
    path: '/equipment',
    access: STAFF,
    query: equipmentQuerySchema,
    answer: json(z.array(equipmentItemSchema)),
  }),
  create: contract({
    method: 'POST',
    path: '/equipment',
    access: KEEPERS,
    body: createEquipmentSchema,
    answer: json(equipmentItemSchema, 201),
  }),
  get: contract({ method: 'GET', path: '/equipment/:id', access: STAFF, params: idParams, answer: json(equipmentDetailSchema) }),
  update: contract({
    method: 'PATCH',
    path: '/equipment/:id',
    access: KEEPERS,
    params: idParams,
    body: updateEquipmentSchema,
    answer: json(equipmentItemSchema),
  }),
  calibrate: contract({
    method: 'POST',
    path: '/equipment/:id/calibrations',
    access: KEEPERS,
    params: idParams,
    body: calibrationSchema,
    answer: json(calibrationResultSchema, 201),
  }),
};
