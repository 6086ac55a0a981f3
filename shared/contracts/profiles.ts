import { z } from 'zod';
import { contract, json, KEEPERS, STAFF } from './contract';
import { equipmentKind, limitRuleDto } from './common';
import { idParams } from '../schemas/params';
import { copyProfileSchema, updateProfileSchema } from '../schemas/limit-profile';

const profileShape = {
  id: z.string(),
  lineageId: z.string(),
  name: z.string(),
  version: z.number().int(),
  rules: z.array(limitRuleDto),
  loopRequired: z.array(equipmentKind),
  /** Copper readings are corrected to this °C (a house rule); null: judged as measured. */
  temperatureReferenceC: z.number().nullable(),
  notes: z.string().nullable(),
  createdAt: z.string(),
  createdBy: z.string().nullable(),
};

/** The latest version of a lineage, as the library lists it. */
export const profileSummarySchema = z.strictObject({
  ...profileShape,
  ruleCount: z.number().int(),
  houseRuleCount: z.number().int(),
  versions: z.array(z.strictObject({ id: z.string(), version: z.number().int(), createdAt: z.string() })),
});
export type ProfileSummary = z.infer<typeof profileSummarySchema>;

/** One version, with its lineage and the venues using it. Sent with ETag = its version. */
export const profileDetailSchema = z.strictObject({
  ...profileShape,
  latestVersion: z.number().int(),
  latestId: z.string(),
  versions: z.array(
    z.strictObject({
      id: z.string(),
      version: z.number().int(),
      createdAt: z.string(),
      byName: z.string().nullable(),
      notes: z.string().nullable(),
    }),
  ),
  usedBy: z.array(
    z.strictObject({ venueId: z.string(), venueName: z.string(), eventName: z.string(), profileId: z.string(), version: z.number().int() }),
  ),
});
export type ProfileDetail = z.infer<typeof profileDetailSchema>;

export const profilesContracts = {
  list: contract({ method: 'GET', path: '/profiles', access: STAFF, answer: json(z.array(profileSummarySchema)) }),
  get: contract({ method: 'GET', path: '/profiles/:id', access: STAFF, params: idParams, answer: json(profileDetailSchema) }),
  copy: contract({
    method: 'POST',
    path: '/profiles/:id/copy',
    access: KEEPERS,
    params: idParams,
    body: copyProfileSchema,
    answer: json(profileDetailSchema, 201),
  }),
  /** An edit is stored as a new version of the lineage (201), never over an old one; If-Match names the latest. */
  update: contract({
    method: 'PUT',
    path: '/profiles/:id',
    access: KEEPERS,
    params: idParams,
    body: updateProfileSchema,
    answer: json(profileDetailSchema, 201),
  }),
};
