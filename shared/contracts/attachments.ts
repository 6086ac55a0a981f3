import { z } from 'zod';
import { contract, file, json, multipart, STAFF, TESTERS, KEEPERS, type Access } from './contract';
import { idParams } from '../schemas/params';
import { ATTACHMENT_EXTENSIONS, attachmentCreatedSchema, attachmentDtoSchema, traceAnalysisDtoSchema } from '../schemas/attachments';

/**
 * The attachments of one kind of owner: listed by whoever may see it, uploaded (one file in the
 * field `file`, multipart) by those who may test the venue or keep the register. An upload sends an
 * Idempotency-Key (a UUID): a retry gets the stored answer; the same bytes again answer 200.
 */
function ownerContracts<const S extends string, const U extends Access>(segment: S, uploaders: U) {
  return {
    list: contract({
      method: 'GET',
      path: `/${segment}/:id/attachments` as `/${S}/:id/attachments`,
      access: STAFF,
      params: idParams,
      answer: json(z.array(attachmentDtoSchema)),
    }),
    upload: contract({
      method: 'POST',
      path: `/${segment}/:id/attachments` as `/${S}/:id/attachments`,
      access: uploaders,
      params: idParams,
      body: multipart(),
      answer: json(attachmentCreatedSchema, 201, 200),
    }),
  };
}

const STORED_TYPES = [...new Set(Object.values(ATTACHMENT_EXTENSIONS).map((e) => e.contentType))];

export const attachmentsContracts = {
  fault: ownerContracts('faults', TESTERS),
  repair: ownerContracts('repairs', TESTERS),
  equipment: ownerContracts('equipment', KEEPERS),
  /** The file as stored (a photo inline, anything else as a download). */
  original: contract({ method: 'GET', path: '/attachments/:id', access: STAFF, params: idParams, answer: file(...STORED_TYPES) }),
  /** A 480 px JPEG of a photo. */
  preview: contract({ method: 'GET', path: '/attachments/:id/preview', access: STAFF, params: idParams, answer: file('image/jpeg') }),
  analysis: contract({
    method: 'GET',
    path: '/attachments/:id/analysis',
    access: STAFF,
    params: idParams,
    answer: json(traceAnalysisDtoSchema),
  }),
};
