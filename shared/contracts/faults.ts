import { z } from 'zod';
import { contract, json, STAFF, TESTERS } from './contract';
import { equipmentRef, faultListItem, fromEnd, testKind } from './common';
import { idParams } from '../schemas/params';
import { readingDtoSchema } from '../schemas/readings';
import { createFaultSchema, createRepairSchema, dismissFaultSchema, REPAIR_ACTIONS, updateFaultSchema } from '../schemas/faults';

/** A saved location estimate, with the distance brought to the near end when the length is known. */
export const faultEstimateSchema = z.strictObject({
  id: z.string(),
  method: z.string(),
  fromEnd,
  distanceM: z.number(),
  fromOtherEndM: z.number().nullable(),
  uncertaintyM: z.number(),
  /** From the near (apparatus) end, whichever end it was measured from, when the length is known. */
  distanceFromNearM: z.number().nullable(),
  faultOhm: z.number().nullable(),
  explanation: z.string(),
  /** The request as saved (its method and numbers). */
  inputs: z.record(z.string(), z.union([z.number(), z.string()])),
  /** The item's recorded length when this estimate was made. */
  itemLengthM: z.number().nullable(),
  itemShortenedSince: z.boolean(),
  createdAt: z.string(),
  createdBy: z.string(),
  createdByName: z.string().nullable(),
});

/** All estimates of a fault weighed together, worded in the reader's units. */
export const combinedEstimateSchema = z.strictObject({
  distanceM: z.number(),
  uncertaintyM: z.number(),
  agree: z.boolean(),
  /** Pairs of estimates (their indexes) whose bands do not overlap. */
  disagreements: z.array(z.tuple([z.number().int(), z.number().int()])),
  explanation: z.string(),
  count: z.number().int(),
  fromEnd: z.literal('near'),
  /** The item's length the weighed estimates were made against. */
  itemLengthM: z.number().nullable(),
  estimateIds: z.array(z.string()),
  /** Estimates shown beside the combination, not weighed in, and why. */
  apart: z.array(z.strictObject({ estimateId: z.string(), kind: z.string(), reason: z.string() })),
});

export const repairSchema = z.strictObject({
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
  createdByName: z.string().nullable(),
});

export const faultDetailSchema = z.strictObject({
  ...faultListItem.shape,
  /** The caller is the event's director and the fault can still be dismissed. */
  canDismiss: z.boolean(),
  lengthM: z.number().nullable(),
  /** The item in the position now (another one after a swap). */
  currentEquipment: equipmentRef.nullable(),
  estimates: z.array(faultEstimateSchema),
  combined: combinedEstimateSchema.nullable(),
  repairs: z.array(repairSchema),
  steps: z.array(
    z.strictObject({
      id: z.string(),
      testKind,
      conductors: z.string(),
      required: z.boolean(),
      latest: readingDtoSchema.nullable(),
      readings: z.array(readingDtoSchema),
    }),
  ),
  /** What the locating forms can start from. */
  prefill: z.strictObject({
    lengthM: z.number().nullable(),
    velocityFactor: z.number().nullable(),
    soundConductor: z.string().nullable(),
    conductorOhm: z.number().nullable(),
    ohmPerMetre: z.number().nullable(),
    ohmPerMetreSource: z.string().nullable(),
  }),
});
export type FaultDetail = z.infer<typeof faultDetailSchema>;

export const faultsContracts = {
  ofVenue: contract({ method: 'GET', path: '/venues/:id/faults', access: STAFF, params: idParams, answer: json(z.array(faultListItem)) }),
  /** ETag: the fault's version, for If-Match on an edit. */
  get: contract({ method: 'GET', path: '/faults/:id', access: STAFF, params: idParams, answer: json(faultDetailSchema) }),
  create: contract({ method: 'POST', path: '/faults', access: TESTERS, body: createFaultSchema, answer: json(faultDetailSchema, 201) }),
  /** If-Match with the fault's ETag. */
  update: contract({
    method: 'PATCH',
    path: '/faults/:id',
    access: TESTERS,
    params: idParams,
    body: updateFaultSchema,
    answer: json(faultDetailSchema),
  }),
  /**
   * One fault-location request (schemas/fault-location.ts) plus fromEnd. The service parses it,
   * after filling in the item's length when the form left it out, so the body is taken as it comes.
   */
  addEstimate: contract({
    method: 'POST',
    path: '/faults/:id/estimates',
    access: TESTERS,
    params: idParams,
    body: z.unknown(),
    answer: json(
      z.strictObject({ estimate: faultEstimateSchema, combined: combinedEstimateSchema.nullable(), fault: faultDetailSchema }),
      201,
    ),
  }),
  addRepair: contract({
    method: 'POST',
    path: '/faults/:id/repairs',
    access: TESTERS,
    params: idParams,
    body: createRepairSchema,
    answer: json(z.strictObject({ repair: repairSchema, fault: faultDetailSchema }), 201),
  }),
  /** The event's director closes a fault that was a typing mistake, with a reason; If-Match with its ETag. */
  dismiss: contract({
    method: 'POST',
    path: '/faults/:id/dismiss',
    access: ['director'],
    params: idParams,
    body: dismissFaultSchema,
    answer: json(faultDetailSchema),
  }),
};
