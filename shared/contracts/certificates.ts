import { z } from 'zod';
import { contract, file, json, multipart, STAFF } from './contract';
import { eventRef, venueStatus } from './common';
import { idParams } from '../schemas/params';
import { revokeCertificateSchema } from '../schemas/sign-off';

export const CERTIFICATE_STATUSES = ['valid', 'superseded', 'revoked'] as const;
export type CertificateStatus = (typeof CERTIFICATE_STATUSES)[number];
const certificateKind = z.enum(['venue', 'strip']);

/** A certificate in a venue's list, newest sign-off first. */
export const certificateSummarySchema = z.strictObject({
  number: z.string(),
  kind: certificateKind,
  stripId: z.string().nullable(),
  stripLabel: z.string().nullable(),
  status: z.enum(CERTIFICATE_STATUSES),
  issuedAt: z.string(),
  signOffId: z.string(),
  signedBy: z.string(),
  signedAt: z.string(),
  supersededAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
  revokedReason: z.string().nullable(),
  /** Superseded-pending: the strip changed after sign-off; an amendment will supersede it. */
  supersededPendingSince: z.string().nullable(),
  /** The certificate that superseded this one by an amendment. */
  successorNumber: z.string().nullable(),
  pdfSha256: z.string().nullable(),
  verifyUrl: z.string(),
});
export type CertificateSummary = z.infer<typeof certificateSummarySchema>;

export const venueCertificatesSchema = z.strictObject({
  venue: z.strictObject({ id: z.string(), name: z.string(), status: venueStatus }),
  event: eventRef,
  canRevoke: z.boolean(),
  certificates: z.array(certificateSummarySchema),
});
export type VenueCertificates = z.infer<typeof venueCertificatesSchema>;

/** What the public check says about one certificate (and only about that one). */
export const verificationSchema = z.strictObject({
  status: z.enum(CERTIFICATE_STATUSES),
  number: z.string(),
  kind: certificateKind,
  event: z.string(),
  eventDates: z.strictObject({ startsOn: z.string(), endsOn: z.string() }),
  venue: z.string(),
  /** The venue's IANA time zone: the page shows the times in it. */
  timeZone: z.string(),
  strips: z.array(z.string()),
  /** A venue certificate's strips whose own certificates were revoked: it no longer covers them. */
  notCovering: z.array(
    z.strictObject({ strip: z.string(), number: z.string(), revokedAt: z.string().nullable(), revokedReason: z.string().nullable() }),
  ),
  organisation: z.string(),
  issuedAt: z.string(),
  signedBy: z.string(),
  signedAt: z.string(),
  profile: z.strictObject({ name: z.string(), version: z.number().int() }),
  items: z.number().int(),
  readings: z.number().int(),
  supersededAt: z.string().nullable(),
  /** Superseded-pending: the strip changed after sign-off; an amendment will supersede it. */
  supersededPendingSince: z.string().nullable(),
  /** An amended strip certificate's successor (superseded by an amendment). */
  successorNumber: z.string().nullable(),
  /** A venue certificate's amendments: new strip certificates issued without re-opening the venue. */
  amendments: z.array(z.strictObject({ number: z.string(), stripId: z.string(), strip: z.string(), at: z.string() })),
  /** A venue certificate's strips out of service now (changed after sign-off, not yet amended). */
  outOfService: z.array(z.strictObject({ stripId: z.string(), strip: z.string(), since: z.string() })),
  revokedAt: z.string().nullable(),
  revokedReason: z.string().nullable(),
  keyId: z.string(),
  jws: z.string(),
  pdfSha256: z.string().nullable(),
  verifyUrl: z.string(),
});
export type Verification = z.infer<typeof verificationSchema>;

export const fileCheckSchema = z.discriminatedUnion('match', [
  z.strictObject({ match: z.literal(false), sha256: z.string() }),
  z.strictObject({ match: z.literal(true), sha256: z.string(), certificate: verificationSchema }),
]);
export type FileCheck = z.infer<typeof fileCheckSchema>;

/** RFC 7517 key set: the public keys (Ed25519) that sign certificates, for outside verifiers. */
export const jwksSchema = z.strictObject({
  keys: z.array(
    z.looseObject({ kty: z.string(), crv: z.string(), x: z.string(), kid: z.string(), alg: z.literal('EdDSA'), use: z.literal('sig') }),
  ),
});

export const certificatesContracts = {
  ofVenue: contract({
    method: 'GET',
    path: '/venues/:id/certificates',
    access: STAFF,
    params: idParams,
    answer: json(venueCertificatesSchema),
  }),
  /** The latest sign-off's PDFs of a venue. */
  zip: contract({ method: 'GET', path: '/venues/:id/certificates.zip', access: STAFF, params: idParams, answer: file('application/zip') }),
  pdf: contract({ method: 'GET', path: '/certificates/:number/pdf', access: STAFF, answer: file('application/pdf') }),
  revoke: contract({
    method: 'POST',
    path: '/certificates/:number/revoke',
    access: ['director', 'admin'],
    body: revokeCertificateSchema,
    answer: json(verificationSchema),
  }),
  /** Public: anyone holding a certificate may check it. A number of no certificate answers 404. */
  verify: contract({ method: 'GET', path: '/verify/:number', access: 'public', answer: json(verificationSchema) }),
  /** Public, and needs no Origin header: the PDF (field `file`) is hashed in memory and never stored. */
  verifyFile: contract({ method: 'POST', path: '/verify/file', access: 'public', body: multipart(), answer: json(fileCheckSchema) }),
  jwks: contract({ method: 'GET', path: '/.well-known/jwks.json', access: 'public', mount: 'root', answer: json(jwksSchema) }),
};
