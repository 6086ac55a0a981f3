import { z } from 'zod';
import { contract, json, STAFF } from './contract';
import { eventRef, stripStatus, venueStatus } from './common';
import { idParams } from '../schemas/params';
import { signOffSchema } from '../schemas/sign-off';

const stepRef = {
  stripId: z.string(),
  stripLabel: z.string(),
  stepId: z.string(),
  positionId: z.string(),
  positionName: z.string(),
  assetTag: z.string().nullable(),
  testKind: z.string(),
  conductors: z.string(),
};
const failingStep = {
  ...stepRef,
  readingId: z.string(),
  valueText: z.string(),
  valueOhm: z.number().nullable(),
  limitOhm: z.number().nullable(),
  limitKind: z.enum(['max', 'min']).nullable(),
  source: z.string(),
  takenAt: z.string(),
};
const missingStep = { ...stepRef, why: z.enum(['no-reading', 'item-swapped']) };
const fault = { faultId: z.string(), positionName: z.string(), kind: z.string(), conductors: z.string(), status: z.string() };
const message = { message: z.string() };

/** What stands between the venue and its sign-off, each with a sentence for the director. */
export const readinessIssueSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('missing'), ...missingStep, ...message }),
  z.strictObject({ kind: z.literal('failing'), ...failingStep, ...message }),
  z.strictObject({
    kind: z.literal('open-fault'),
    stripId: z.string(),
    stripLabel: z.string(),
    faultKind: z.string(),
    faultId: z.string(),
    positionName: z.string(),
    conductors: z.string(),
    status: z.string(),
    ...message,
  }),
  z.strictObject({ kind: z.literal('no-steps'), stripId: z.string(), stripLabel: z.string(), ...message }),
  z.strictObject({ kind: z.literal('nothing-to-certify'), ...message }),
]);

export const stripReadinessSchema = z.strictObject({
  stripId: z.string(),
  label: z.string(),
  state: z.enum(['ready', 'withdrawn', 'exception', 'missing', 'failing', 'no-steps']),
  status: stripStatus,
  /** Why the strip is left out of this sign-off (withdrawn before, or an exception now). */
  exceptionReason: z.string().nullable(),
  requiredSteps: z.number().int(),
  passedSteps: z.number().int(),
  missing: z.array(z.strictObject(missingStep)),
  failing: z.array(z.strictObject(failingStep)),
  openFaults: z.array(z.strictObject(fault)),
  nearLimit: z.array(z.strictObject(failingStep)),
});

export const readinessSchema = z.strictObject({
  venue: z.strictObject({ id: z.string(), name: z.string(), status: venueStatus }),
  event: eventRef,
  canSignOff: z.boolean(),
  signedOff: z.strictObject({ signOffId: z.string(), signedAt: z.string() }).nullable(),
  ready: z.boolean(),
  strips: z.array(stripReadinessSchema),
  nearLimit: z.array(z.strictObject(failingStep)),
  exceptions: z.array(
    z.strictObject({ stripId: z.string(), label: z.string(), reason: z.string(), source: z.enum(['withdrawn', 'sign-off']) }),
  ),
  issues: z.array(readinessIssueSchema),
  counts: z.strictObject({ strips: z.number().int(), ready: z.number().int(), excepted: z.number().int(), notReady: z.number().int() }),
});
export type Readiness = z.infer<typeof readinessSchema>;

export const signOffResultSchema = z.strictObject({
  signOffId: z.string(),
  signedAt: z.string(),
  certificates: z.array(
    z.strictObject({
      number: z.string(),
      kind: z.enum(['venue', 'strip']),
      stripId: z.string().optional(),
      status: z.literal('valid'),
      pdfSha256: z.string(),
      verifyUrl: z.string(),
    }),
  ),
});
export type SignOffResult = z.infer<typeof signOffResultSchema>;

export const signOffContracts = {
  readiness: contract({ method: 'GET', path: '/venues/:id/readiness', access: STAFF, params: idParams, answer: json(readinessSchema) }),
  /**
   * Directors only; the service then checks it is this event's director (object level). 409
   * not-ready carries the issues; 401 wrong-password when the re-entered password is not right.
   */
  signOff: contract({
    method: 'POST',
    path: '/venues/:id/sign-off',
    access: ['director'],
    params: idParams,
    body: signOffSchema,
    answer: json(signOffResultSchema, 201),
  }),
};
