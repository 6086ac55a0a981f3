import { z } from 'zod';
import { contract, json, STAFF, TESTERS } from './contract';
import { idParams } from '../schemas/params';
import { createReadingSchema, readingBatchResultSchema, readingDtoSchema, readingsBatchSchema } from '../schemas/readings';
import { createLeadNullSchema, leadNullDtoSchema } from '../schemas/lead-nulls';

export const readingsContracts = {
  /** 201 the first time, 200 with the stored reading when the same id and body come again. */
  record: contract({
    method: 'POST',
    path: '/readings',
    access: TESTERS,
    body: createReadingSchema,
    answer: json(readingDtoSchema, 201, 200),
    hot: true,
  }),
  /**
   * Up to 200 readings in one commit, each answered with the status and body it would have had on
   * its own (each is checked against createReadingSchema alone, so the list takes any items).
   */
  batch: contract({
    method: 'POST',
    path: '/readings/batch',
    access: TESTERS,
    body: readingsBatchSchema,
    answer: json(z.strictObject({ results: z.array(readingBatchResultSchema) })),
  }),
  get: contract({ method: 'GET', path: '/readings/:id', access: STAFF, params: idParams, answer: json(readingDtoSchema) }),
  /** The caller's own test-lead null (201, or 200 with the stored one when the same id and content come again). */
  leadNull: contract({
    method: 'POST',
    path: '/lead-nulls',
    access: TESTERS,
    body: createLeadNullSchema,
    answer: json(leadNullDtoSchema, 201, 200),
  }),
};
