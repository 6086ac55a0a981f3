// The certificates as PDF: a venue certificate (summary, then an annex with every reading) and a
// one-page certificate per strip. Rendered only from the signed record and the certified readings,
// with the signing time as the document date, so the same record always gives the same bytes.
import { COLOURS, createDocument, toBuffer, type Column } from './layout';
import type { CertificatePayload, CertifiedReading } from '../signing/certificate-record';
import { formatOhm } from '../../shared/domain/units';
import { stepsForKind } from '../../shared/domain/checklist';
import type { TestKind } from '../../shared/domain/limits';
import { legendText } from '../../shared/domain/symbols';
import { clockFor, formatDateRange, testLabel, ruleLabel, verdictColour, verdictMark, Writer } from './certificate-writer';
import { DEFAULT_TIME_ZONE } from '../../shared/format/date-time';
import {
  valueText,
  readingColumns,
  commonFacts,
  limitsTable,
  leadNullsTable,
  dismissedTable,
  equipmentFacts,
  equipmentSummary,
} from './certificate-blocks';

export interface CertificateDocument {
  payload: CertificatePayload;
  jws: string;
  keyId: string;
  /** Venue: all certified readings; strip: that strip's. */
  readings: CertifiedReading[];
  /** The venue's IANA zone, the document's clock (DEFAULT_TIME_ZONE when absent). */
  timeZone?: string;
}

function renderVenue(w: Writer, doc: CertificateDocument) {
  const { payload: p } = doc;
  w.newPage('portrait');
  w.eyebrow('Venue certificate · electrical testing of competition equipment');
  w.title(p.venue.name, `${p.event.name} · ${formatDateRange(p.event.startsOn, p.event.endsOn)} · ${p.issuer.organisation.name}`);
  const certified = p.strips.length;
  const total = certified + p.exceptions.length;
  w.text(
    `This certifies that the competition equipment of the ${certified === 1 ? 'strip' : `${certified} strips`} listed below was tested strip by strip, and that the latest reading of every required test was within the limits of the profile named here when the venue was signed off. The limits and their sources are in Annex A, every reading in Annex B, the test-lead nulls and any fault dismissed as a typing mistake in Annex C.`,
    { size: 9.5 },
    12,
  );
  w.facts([
    ['Event', p.event.name],
    ['Dates', formatDateRange(p.event.startsOn, p.event.endsOn)],
    ['Venue', p.venue.name],
    ['Strips certified', `${certified} of ${total}`],
    ['Items tested', String(p.items.length)],
    ['Readings', `${p.readings.count}${p.readings.nearLimit ? `, ${p.readings.nearLimit} near limit` : ', none near limit'}`],
    ...commonFacts(p, w.clock),
    ['Organisation', p.issuer.organisation.name],
  ]);

  w.section('Strips certified');
  const stripNo = new Map(p.related.stripCertificates.map((s) => [s.stripId, s.number]));
  w.table(p.strips, [
    { header: 'Strip', width: 54, value: (s) => s.label, style: () => ({ weight: 500 }) },
    { header: 'Zone', width: 40, value: (s) => s.zone ?? '—' },
    { header: 'Scoring apparatus · floor cables · reels · piste', width: 166, value: (s) => equipmentSummary(s.items) },
    { header: 'Readings', width: 46, align: 'right', value: (s) => String(s.readings) },
    { header: 'Near limit', width: 40, align: 'right', value: (s) => String(s.nearLimit) },
    { header: 'Strip certificate', width: 104, value: (s) => stripNo.get(s.id) ?? '—', nowrap: true },
  ]);

  w.section('Left out of this certificate', 20);
  if (p.exceptions.length === 0) w.text('None: every strip of the venue is certified.', { size: 9, color: COLOURS.soft });
  else
    w.table(p.exceptions, [
      { header: 'Strip', width: 60, value: (e) => e.label, style: () => ({ weight: 500 }) },
      { header: 'Reason', width: 300, value: (e) => e.reason },
      { header: 'Recorded', width: 90, value: (e) => (e.source === 'withdrawn' ? 'Withdrawn before sign-off' : 'At sign-off') },
    ]);

  w.section('Statement of the technical director', 30);
  w.text(`“${p.statement}”`, { size: 9.5, color: COLOURS.ink }, 12);
  w.scope();
  w.signature('Annex D');

  // The annexes are landscape, so each rule and each reading fits on a line.
  w.newPage('landscape');
  w.eyebrow('Annex A');
  w.pen.line('Limits applied and their sources', w.frame.left, w.y, { size: 16, weight: 600 });
  w.y += 25;
  w.text(
    `Limit profile “${p.profile.name}”, version ${p.profile.version}. Each reading was judged against the rule for its equipment and test. A house rule is the organisation's own choice where the FIE Material Rules give no number.`,
    { size: 8.5, color: COLOURS.soft },
    8,
  );
  limitsTable(w, p.profile.rules, 7.5, true);

  w.need(120);
  w.y += 14;
  w.eyebrow('Annex B');
  w.pen.line('Readings', w.frame.left, w.y, { size: 16, weight: 600 });
  w.y += 25;
  w.text(
    `The latest reading of every required test on the certified strips, as signed: ${p.readings.count} readings. Values are in ohms after the tester's test-lead null (the Lead null column, recorded in Annex C) was subtracted from what the meter showed. SHA-256 of the list in canonical JSON (RFC 8785): ${p.readings.digest}.`,
    { size: 8, color: COLOURS.soft },
    8,
  );
  w.table(doc.readings, readingColumns(w.clock), { size: 7.5, headerSize: 6, padY: 2.6, zebra: true });

  w.need(90);
  w.y += 14;
  w.eyebrow('Annex C');
  w.pen.line('Test-lead nulls and dismissed faults', w.frame.left, w.y, { size: 16, weight: 600 });
  w.y += 25;
  w.section('Test-lead nulls used', 30);
  leadNullsTable(w, p);
  w.section('Faults dismissed by the technical director as typing mistakes', 30);
  dismissedTable(w, p.dismissedFaults);
  w.signatureAnnex('Annex D', doc.jws, doc.keyId);
}

// The strip certificate shows its readings as a grid: one row per item, one column per test, in
// the checklist's own order (a cable with its loop, then a piste).
const SHORT: Record<TestKind, string> = {
  continuity: 'Cont.',
  insulation: 'Ins.',
  loop: 'Loop',
  'piste-end-to-end': 'Piste end to end',
  'piste-earth': 'Piste earth',
};
const GRID: { key: string; header: string }[] = [
  ...stepsForKind('floor-cable', { loopRequired: ['floor-cable'] }),
  ...stepsForKind('piste', {}),
].map((st) => ({
  key: `${st.testKind}|${st.conductors}`,
  header: st.testKind.startsWith('piste') ? SHORT[st.testKind] : `${SHORT[st.testKind]} ${st.conductors}`,
}));
interface GridRow {
  position: string;
  assetTag: string | null;
  cells: Map<string, CertifiedReading>;
  other: CertifiedReading[];
}

function readingGrid(readings: CertifiedReading[]) {
  const rows = new Map<string, GridRow>();
  for (const r of readings) {
    const k = `${r.position}|${r.assetTag}`;
    const row: GridRow = rows.get(k) ?? { position: r.position, assetTag: r.assetTag, cells: new Map(), other: [] };
    const key = `${r.testKind}|${r.conductors}`;
    if (GRID.some((g) => g.key === key)) row.cells.set(key, r);
    else row.other.push(r);
    rows.set(k, row);
  }
  const list = [...rows.values()];
  const used = GRID.filter((g) => list.some((row) => row.cells.has(g.key)));
  const columns: Column<GridRow>[] = [
    { header: 'Position', width: 70, value: (row) => row.position, style: () => ({ weight: 500 }) },
    { header: 'Asset tag', width: 44, value: (row) => row.assetTag ?? '—', nowrap: true },
    ...used.map((g): Column<GridRow> => ({
      header: g.header,
      width: 40,
      nowrap: true,
      value: (row) => {
        const r = row.cells.get(g.key);
        return r ? valueText(r) : '';
      },
      style: (row) => {
        const r = row.cells.get(g.key);
        return r && r.verdict !== 'pass' ? { color: verdictColour(r.verdict), weight: 600 } : {};
      },
      mark: (row, pen, x, y, size) => {
        const r = row.cells.get(g.key);
        return r ? verdictMark(pen, r.verdict, x, y, size) : 0;
      },
    })),
  ];
  if (list.some((row) => row.other.length > 0))
    columns.push({
      header: 'Other',
      width: 60,
      value: (row) => row.other.map((r) => `${testLabel(r.testKind)} ${r.conductors} ${valueText(r)}`).join('; '),
    });
  return { rows: list, columns };
}

/**
 * The venue with the strip's zone, unless the venue's name already says it: a zone "Annex" in
 * "Riverside Annex" would read "Riverside Annex, Annex".
 */
export function placeOf(venueName: string, zone: string | null | undefined): string {
  const z = zone?.trim();
  if (!z) return venueName;
  const words = (t: string) =>
    t
      .toLocaleLowerCase()
      .split(/[^\p{L}\p{N}]+/u)
      .filter(Boolean);
  const name = words(venueName).join(' ');
  return ` ${name} `.includes(` ${words(z).join(' ')} `) ? venueName : `${venueName}, ${z}`;
}

function renderStrip(w: Writer, doc: CertificateDocument) {
  const { payload: p } = doc;
  const strip = p.strips[0];
  w.newPage('portrait');
  w.eyebrow('Strip certificate · electrical testing of competition equipment');
  w.title(strip.label, `${p.venue.name} · ${p.event.name} · ${formatDateRange(p.event.startsOn, p.event.endsOn)}`);
  w.text(
    `This certifies that the competition equipment of ${strip.label} listed below was tested, and that the latest reading of every required test was within the limits of the profile named here when the venue was signed off.`,
    { size: 9.5 },
    10,
  );
  w.facts(
    [
      ['Venue', placeOf(p.venue.name, strip.zone)],
      ...equipmentFacts(strip.items),
      ['Readings', `${strip.readings}${strip.nearLimit ? `, ${strip.nearLimit} near limit` : ', none near limit'}`],
      ...commonFacts(p, w.clock).filter(([k]) => k !== 'Limit profile'),
      ['Venue certificate', p.related.venueCertificate ?? '—'],
    ],
    4,
  );
  w.section('Readings', 40);
  const grid = readingGrid(doc.readings);
  w.table(grid.rows, grid.columns, { size: 7.5, headerSize: 6, padY: 3.4 });
  const nulls = p.leadNulls.map(
    (n) => `${formatOhm(n.valueOhm)} (${n.takenBy}, ${w.clock.dateTime(n.takenAt)}${n.meter ? `, ${n.meter}` : ''})`,
  );
  w.text(
    `Values are the latest reading of each test, in ohms; OL is over range (open), which passes for insulation. Marks: ${legendText()}. ${nulls.length ? `The test-lead null was subtracted from what the meter showed: ${nulls.join('; ')}.` : 'No test-lead null was subtracted.'}`,
    { size: 7, color: COLOURS.soft },
    6,
  );
  if (p.dismissedFaults.length > 0) {
    w.section('Faults dismissed by the technical director as typing mistakes', 30);
    dismissedTable(w, p.dismissedFaults, false);
  }
  w.section(`Limits applied: ${p.profile.name}, version ${p.profile.version}`, 30);
  const used = new Set(doc.readings.map((r) => r.ruleId));
  w.ruleList(p.profile.rules.filter((r) => used.has(r.id)).map((r) => [ruleLabel(r.id), `${r.limit} · ${r.source}`]));
  w.text(`Statement of the technical director: “${p.statement}”`, { size: 8, color: COLOURS.ink }, 10);
  w.scope();
  w.signature('the annex at the end');
  w.signatureAnnex('Annex', doc.jws, doc.keyId);
}

export async function renderCertificatePdf(input: CertificateDocument): Promise<Buffer> {
  const p = input.payload;
  const what = p.kind === 'venue' ? 'Venue certificate' : 'Strip certificate';
  const name = p.kind === 'venue' ? p.venue.name : `${p.strips[0].label}, ${p.venue.name}`;
  const doc = createDocument({
    title: `${what} ${p.number}: ${name}`,
    subject: `${what} of electrical testing of competition equipment, ${p.event.name}, ${p.venue.name}`,
    keywords: ['Stripwarden', 'certificate', p.number, p.event.name, p.venue.name, ...p.strips.map((s) => s.label)].join(', '),
    creationDate: new Date(p.signedAt),
  });
  const w = new Writer(doc, p, `${what} · ${p.event.name} · ${p.venue.name}`, clockFor(input.timeZone ?? DEFAULT_TIME_ZONE, p.signedAt));
  if (p.kind === 'venue') renderVenue(w, input);
  else renderStrip(w, input);
  w.footers();
  return toBuffer(doc);
}
