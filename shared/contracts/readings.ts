import { contract, json, STAFF, TESTERS } from './contract';
import { idParams } from '../schemas/params';
import { createReadingSchema, readingDtoSchema } from '../schemas/readings';

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
  get: contract({ method: 'GET', path: '/readings/:id', access: STAFF, params: idParams, answer: json(readingDtoSchema) }),
};
