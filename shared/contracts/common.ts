// Pieces of answers that several areas share: an item of the register as lists show it, a limit
// rule, a fault in a list, the status words of strips and venues.
import { z } from 'zod';
import { EQUIPMENT_KINDS, TEST_KINDS } from '../domain/limits';
import type { StripStatus } from '../domain/progress';
import { EQUIPMENT_STATUSES } from '../schemas/equipment';
import { FAULT_KINDS, FAULT_STATUSES } from '../schemas/faults';

export const STRIP_STATUSES = [
  'not-started',
  'in-progress',
  'clear',
  'fault-open',
  'withdrawn',
  'out-of-service',
] as const satisfies readonly StripStatus[];
export const stripStatus = z.enum(STRIP_STATUSES);
export const VENUE_STATUSES = ['planning', 'testing', 'signed-off'] as const;
export const venueStatus = z.enum(VENUE_STATUSES);
export const equipmentKind = z.enum(EQUIPMENT_KINDS);
export const testKind = z.enum(TEST_KINDS);
export const equipmentStatus = z.enum(EQUIPMENT_STATUSES);
export const faultKind = z.enum(FAULT_KINDS);
export const faultStatus = z.enum(FAULT_STATUSES);
export const fromEnd = z.enum(['near', 'far']);

/** Counts by strip status, every status present. */
export const stripStatusCounts = z.strictObject({
  'not-started': z.number().int(),
  'in-progress': z.number().int(),
  clear: z.number().int(),
  'fault-open': z.number().int(),
  withdrawn: z.number().int(),
  'out-of-service': z.number().int(),
});

/** Steps of a strip or a venue by their latest reading. */
export const stepCountsShape = {
  total: z.number().int(),
  done: z.number().int(),
  passed: z.number().int(),
  nearLimit: z.number().int(),
  failed: z.number().int(),
};

export const eventRef = z.strictObject({ id: z.string(), name: z.string(), startsOn: z.string(), endsOn: z.string() });
export const person = z.strictObject({ id: z.string(), name: z.string(), email: z.string() });

/** A register item where a strip, a fault or a list shows it. */
export const equipmentRef = z.strictObject({
  id: z.string(),
  assetTag: z.string(),
  kind: equipmentKind,
  description: z.string(),
  lengthM: z.number().nullable(),
  velocityFactor: z.number().nullable(),
  conductorMm2: z.number().nullable(),
  status: equipmentStatus,
});

/** A limit rule as stored with a profile (the input schema with its checks is in schemas/limit-profile). */
export const limitRuleDto = z.strictObject({
  id: z.string(),
  equipmentKind,
  testKind,
  maxOhm: z.number().optional(),
  maxOhmPerMetre: z.number().optional(),
  connectorAllowanceOhm: z.number().optional(),
  minOhm: z.number().optional(),
  nearLimitFraction: z.number().optional(),
  nearMinOhm: z.number().optional(),
  source: z.string(),
  houseRule: z.boolean(),
  note: z.string().optional(),
});

/** The one estimate a list shows: the combination of several, or the only one. */
export const estimateSummary = z.strictObject({
  method: z.string(),
  distanceM: z.number(),
  uncertaintyM: z.number(),
  fromEnd,
  count: z.number().int(),
  agree: z.boolean(),
});

/** A fault in the lists of a venue, a strip and the board. */
export const faultListItem = z.strictObject({
  id: z.string(),
  venueId: z.string(),
  stripId: z.string(),
  stripLabel: z.string(),
  positionId: z.string(),
  positionName: z.string(),
  stepId: z.string().nullable(),
  readingId: z.string().nullable(),
  equipment: equipmentRef.nullable(),
  kind: faultKind,
  conductors: z.string(),
  status: faultStatus,
  notes: z.string().nullable(),
  version: z.number().int(),
  estimate: estimateSummary.nullable(),
  openedAt: z.string(),
  openedBy: z.string(),
  openedByName: z.string().nullable(),
  closedAt: z.string().nullable(),
  /** Closed by the event's director as a typing mistake (null when it closed by a retest, or is open). */
  dismissal: z.strictObject({ at: z.string(), by: z.string().nullable(), byName: z.string().nullable(), reason: z.string() }).nullable(),
});
export type FaultListItem = z.infer<typeof faultListItem>;

/** A strip and where it stands, as the board and the venue's strip list show it. */
export const stripProgressShape = {
  id: z.string(),
  label: z.string(),
  zone: z.string().nullable(),
  sortOrder: z.number().int(),
  status: stripStatus,
  withdrawnReason: z.string().nullable(),
  openFaults: z.number().int(),
  ...stepCountsShape,
};
