// What a certificate says, as a record: the payload that is signed (RFC 8785 canonical JSON in a
// JWS) and the certified readings whose digest it carries. The PDF is rendered from these only.
import { createHash, randomInt } from 'node:crypto';
import { turns, type Turn } from '../lib/turns';
import { canonicalJson } from './signing-keys';
import { makeCertificateNumber, type CertificateKind } from '../../shared/domain/certificate-number';

// Version 2 added the test-lead null of each reading, the nulls used and the dismissed faults.
// Version 3: a strip's items are every position of its plan, the scoring apparatus too (it has no
// readings of its own), each saying whether it was measured.
export const CERTIFICATE_FORMAT = 'stripwarden-certificate/3';
export const SCOPE_SENTENCE =
  "This certificate covers the competition equipment listed and tested, not the building's electrical installation: the mains supply and the earthing of the hall are for licensed electricians under local codes.";

export interface CertifiedReading {
  readingId: string;
  stripId: string;
  stripLabel: string;
  position: string;
  equipmentKind: string;
  assetTag: string | null;
  testKind: string;
  conductors: string;
  valueText: string;
  /** After the test-lead null was subtracted. */
  valueOhm: number | null;
  overRange: boolean;
  /** The test-lead null subtracted (null: none) and its record. */
  leadNullOhm: number | null;
  leadNullId: string | null;
  limitOhm: number | null;
  limitKind: 'max' | 'min' | null;
  verdict: 'pass' | 'near-limit' | 'fail';
  source: string;
  ruleId: string | null;
  profileVersion: number;
  takenById: string;
  takenBy: string;
  takenAt: string;
}

export interface CertificateItem {
  position: string;
  kind: string;
  assetTag: string | null;
  /** Certified readings were taken on it (absent in version 2 records, where every item listed was). */
  measured?: boolean;
}

/** A test-lead null that certified readings used: who measured it, when, with which meter. */
export interface CertifiedLeadNull {
  id: string;
  valueOhm: number;
  takenById: string;
  takenBy: string;
  takenAt: string;
  meter: string | null;
  readings: number;
}

/** A fault the event's director closed as a typing mistake, with the reason given. */
export interface DismissedFault {
  faultId: string;
  stripId: string;
  stripLabel: string;
  position: string;
  kind: string;
  conductors: string;
  openedAt: string;
  dismissedById: string | null;
  dismissedBy: string;
  dismissedAt: string;
  reason: string;
}

export interface CertificatePayload {
  format: typeof CERTIFICATE_FORMAT;
  number: string;
  kind: 'venue' | 'strip';
  issuer: { name: 'Stripwarden'; origin: string; organisation: { id: string; name: string } };
  event: { id: string; name: string; startsOn: string; endsOn: string };
  venue: { id: string; name: string };
  strips: { id: string; label: string; zone: string | null; items: CertificateItem[]; readings: number; nearLimit: number }[];
  exceptions: { stripId: string; label: string; reason: string; source: 'withdrawn' | 'sign-off' }[];
  /** Asset tags of every item certified, sorted. */
  items: string[];
  readings: { count: number; nearLimit: number; digestAlg: 'SHA-256'; digest: string };
  profile: {
    id: string;
    name: string;
    version: number;
    rules: { id: string; source: string; limit: string; note: string | null }[];
    /** How a cable's temperature was treated (judged as measured, or corrected: a house rule). */
    temperature?: string;
  };
  testedBy: { id: string; name: string }[];
  leadNulls: CertifiedLeadNull[];
  dismissedFaults: DismissedFault[];
  testedFrom: string;
  testedTo: string;
  signer: { id: string; name: string; role: 'Technical director' };
  signedAt: string;
  statement: string;
  scope: string;
  related: { venueCertificate: string | null; stripCertificates: { stripId: string; label: string; number: string }[] };
  verifyUrl: string;
}

/**
 * Each reading's canonical JSON, kept while the reading object lives: a sign-off hashes every
 * certified reading twice (the venue's digest and its strip's), and the text is the same.
 */
const canonicalText = new WeakMap<CertifiedReading, string>();
const canonicalOf = (r: CertifiedReading) => {
  let text = canonicalText.get(r);
  if (text === undefined) canonicalText.set(r, (text = canonicalJson(r)));
  return text;
};

/**
 * SHA-256 over the canonical JSON of the certified readings, in their certificate order, hashed a
 * few milliseconds at a time with the event loop's turn between (server/lib/turns.ts): a venue's
 * 3,400 readings are some 45 ms of canonical JSON, which readings arriving meanwhile would
 * otherwise wait out in one piece. The bytes are those of the whole list: RFC 8785 writes an array
 * as its members' canonical JSON between brackets, separated by commas.
 */
export async function readingsDigest(list: CertifiedReading[], turn: Turn = turns()): Promise<string> {
  const hash = createHash('sha256').update('[');
  for (let i = 0; i < list.length; i++) {
    await turn();
    hash.update(i === 0 ? canonicalOf(list[i]) : `,${canonicalOf(list[i])}`);
  }
  return hash.update(']').digest('hex');
}

/** A new certificate number with 40 bits from the CSPRNG (shared/domain/certificate-number.ts). */
export const newCertificateNumber = (kind: CertificateKind, year: number): string => makeCertificateNumber(kind, year, () => randomInt(32));

export const verifyUrlFor = (origin: string, number: string) => `${origin}/verify/${number}`;
