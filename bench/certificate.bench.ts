// The venue certificate of a 120-strip venue with every reading, against pdfkit writing the same
// number of pages of plain text with the same font embedded (unpacked from its .woff, as the
// certificates use it). Also one strip certificate, as a sign-off renders 120 of them.
import PDFDocument from 'pdfkit';
import { readFileSync } from 'node:fs';
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { join } from 'node:path';
import { renderCertificatePdf, type CertificateDocument } from '../server/pdf/certificate-pdf';
import { CERTIFICATE_FORMAT, SCOPE_SENTENCE, readingsDigest, type CertifiedReading } from '../server/signing/certificate-record';
import { canonicalJson } from '../server/signing/signing-keys';
import { DEFAULT_LIMIT_PROFILE } from '../shared/domain/limits';
import { DEFAULT_POSITION_TEMPLATE, stepsForKind } from '../shared/domain/checklist';
import { judgeTypedReading } from '../shared/domain/typed-reading';
import { ruleLimitText } from '../server/services/sign-off-render';
import { sfntFromWoff } from '../server/pdf/woff';
import { bestOfAsync, type BenchResult } from './lib';

const STRIPS = 120;
const FONT = sfntFromWoff(readFileSync(join(import.meta.dirname, '../server/pdf/fonts/ibm-plex-sans-latin-400-normal.woff')));
const b64 = (s: string | Buffer) => Buffer.from(s).toString('base64url');

/** The one test-lead null every reading of the benchmark venue was typed with. */
const LEAD_NULL = { id: 'lead-1', valueOhm: 0.1 };

/** A fully tested venue as the sign-off would certify it: every step of every strip, passing. */
async function venueDocument(): Promise<CertificateDocument> {
  const readings: CertifiedReading[] = [];
  const strips: CertificateDocument['payload']['strips'] = [];
  const tags: string[] = [];
  let tag = 0;
  for (let s = 0; s < STRIPS; s++) {
    const stripId = randomUUID();
    const label = `Strip ${s + 1}`;
    const conductive = s < 40;
    const items: { position: string; kind: string; assetTag: string | null }[] = [];
    for (const pos of DEFAULT_POSITION_TEMPLATE) {
      if (pos.pisteOnly && !conductive) continue;
      const assetTag = `EQ-${String(++tag).padStart(4, '0')}`;
      tags.push(assetTag);
      items.push({ position: pos.name, kind: pos.equipmentKind, assetTag });
      for (const step of stepsForKind(pos.equipmentKind, DEFAULT_LIMIT_PROFILE)) {
        const valueText = step.testKind === 'insulation' ? 'OL' : step.testKind.startsWith('piste') ? '1.8' : '0.46';
        const lengthM = pos.equipmentKind === 'reel' ? 20 : pos.equipmentKind === 'floor-cable' ? 12 : 14;
        const judged = judgeTypedReading(
          valueText,
          {
            profile: DEFAULT_LIMIT_PROFILE,
            equipmentKind: pos.equipmentKind,
            testKind: step.testKind,
            conductors: step.conductors,
            lengthM,
          },
          LEAD_NULL.valueOhm,
        );
        if (!judged.ok) throw new Error(judged.message);
        const v = judged.verdict;
        readings.push({
          readingId: randomUUID(),
          stripId,
          stripLabel: label,
          position: pos.name,
          equipmentKind: pos.equipmentKind,
          assetTag,
          testKind: step.testKind,
          conductors: step.conductors,
          valueText,
          valueOhm: judged.valueOhm,
          overRange: judged.overRange,
          leadNullOhm: judged.leadNullOhm,
          leadNullId: LEAD_NULL.id,
          limitOhm: v.limitOhm,
          limitKind: v.limitKind,
          verdict: v.verdict,
          source: v.source,
          ruleId: v.ruleId,
          profileVersion: DEFAULT_LIMIT_PROFILE.version,
          takenById: 'tech-1',
          takenBy: 'Sam Reyes',
          takenAt: new Date(Date.parse('2026-11-21T07:00:00Z') + readings.length * 20_000).toISOString(),
        });
      }
    }
    const own = readings.filter((r) => r.stripId === stripId);
    strips.push({ id: stripId, label, zone: `Row ${Math.floor(s / 10) + 1}`, items, readings: own.length, nearLimit: 0 });
  }
  const payload: CertificateDocument['payload'] = {
    format: CERTIFICATE_FORMAT,
    number: 'SW-2026-BENC-HMRK-V',
    kind: 'venue',
    issuer: { name: 'Stripwarden', origin: 'http://localhost:3000', organisation: { id: 'org', name: 'Lakeshore Fencing League' } },
    event: { id: 'event', name: 'Autumn Cup 2026', startsOn: '2026-11-21', endsOn: '2026-11-22' },
    venue: { id: 'venue', name: 'Benchmark Arena' },
    strips,
    exceptions: [],
    items: tags.sort(),
    readings: { count: readings.length, nearLimit: 0, digestAlg: 'SHA-256', digest: await readingsDigest(readings) },
    profile: {
      id: 'profile',
      name: DEFAULT_LIMIT_PROFILE.name,
      version: DEFAULT_LIMIT_PROFILE.version,
      rules: DEFAULT_LIMIT_PROFILE.rules.map((r) => ({ id: r.id, source: r.source, limit: ruleLimitText(r), note: r.note ?? null })),
    },
    testedBy: [{ id: 'tech-1', name: 'Sam Reyes' }],
    leadNulls: [
      {
        ...LEAD_NULL,
        takenById: 'tech-1',
        takenBy: 'Sam Reyes',
        takenAt: '2026-11-21T06:58:00.000Z',
        meter: 'Meter 2',
        readings: readings.length,
      },
    ],
    dismissedFaults: [],
    testedFrom: readings[0].takenAt,
    testedTo: readings[readings.length - 1].takenAt,
    signer: { id: 'td', name: 'Marco Dal Bello', role: 'Technical director' },
    signedAt: '2026-11-21T18:00:00.000Z',
    statement: 'I have reviewed the readings listed in this certificate and sign the venue off for competition.',
    scope: SCOPE_SENTENCE,
    related: {
      venueCertificate: null,
      stripCertificates: strips.map((s, i) => ({ stripId: s.id, label: s.label, number: `SW-2026-STRP-${String(i).padStart(4, '0')}-S` })),
    },
    verifyUrl: 'http://localhost:3000/verify/SW-2026-BENC-HMRK-V',
  };
  // A JWS of the real shape and size (the renderer prints its fingerprint and the key id).
  const jws = `${b64(JSON.stringify({ alg: 'EdDSA', kid: 'bench' }))}.${b64(canonicalJson(payload))}.${b64(randomBytes(64))}`;
  return { payload, jws, keyId: 'bench', readings };
}

/** The strip certificate of the venue's first strip, as the sign-off issues it beside the venue's. */
function stripDocument(venue: CertificateDocument): CertificateDocument {
  const strip = venue.payload.strips[0];
  return {
    ...venue,
    readings: venue.readings.filter((r) => r.stripId === strip.id),
    payload: {
      ...venue.payload,
      kind: 'strip',
      number: 'SW-2026-BENC-STRP-S',
      strips: [strip],
      items: strip.items.flatMap((i) => (i.assetTag ? [i.assetTag] : [])),
      related: { venueCertificate: venue.payload.number, stripCertificates: [] },
      verifyUrl: 'http://localhost:3000/verify/SW-2026-BENC-STRP-S',
    },
  };
}

const pageCount = (pdf: Buffer) => (pdf.toString('latin1').match(/\/Type \/Page\b/g) ?? []).length;

/** The limit: pdfkit alone, the same number of A4 pages of plain text in the same font. */
function plainText(pages: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4', margin: 56, autoFirstPage: false });
    doc.registerFont('plex', FONT);
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    const line = 'Strip 42 · Left floor cable · EQ-0042 · continuity A · 0.46 Ω · max 1.0 Ω · pass · 21/11 07:14 · Sam Reyes';
    for (let p = 0; p < pages; p++) {
      doc.addPage();
      doc.font('plex').fontSize(8);
      for (let l = 0; l < 60; l++) doc.text(`${p + 1}.${l + 1} ${line}`, 56, 60 + l * 12, { lineBreak: false });
    }
    doc.end();
  });
}

export async function run(): Promise<BenchResult> {
  const input = await venueDocument();
  const cert = await bestOfAsync(3, () => renderCertificatePdf(input));
  const pages = pageCount(cert.value);
  const plain = await bestOfAsync(3, () => plainText(pages));
  const ratio = cert.ms / plain.ms;
  const strip = await bestOfAsync(5, () => renderCertificatePdf(stripDocument(input)));
  return {
    name: `Venue certificate, ${STRIPS} strips`,
    ratio,
    ratioMeaning: 'certificate render time ÷ pdfkit writing as many pages of plain text (same font)',
    target: '≤ 3',
    pass: ratio <= 3,
    figures: {
      strips: STRIPS,
      readings: input.readings.length,
      pages,
      certificateMs: +cert.ms.toFixed(1),
      certificateKiB: Math.round(cert.value.length / 1024),
      plainTextPages: pageCount(plain.value),
      plainTextMs: +plain.ms.toFixed(1),
      plainTextKiB: Math.round(plain.value.length / 1024),
      stripCertificateMs: +strip.ms.toFixed(1),
      stripCertificatePages: pageCount(strip.value),
      sha256: createHash('sha256').update(cert.value).digest('hex').slice(0, 16),
    },
  };
}
