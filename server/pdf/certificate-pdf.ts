// The certificates as PDF: a venue certificate (summary, then an annex with every reading) and a
// one-page certificate per strip. Rendered only from the signed record and the certified readings,
// with the signing time as the document date, so the same record always gives the same bytes.
import { COLOURS, createDocument, toBuffer, type Column } from './layout';
import type { CertificatePayload, CertifiedReading } from '../signing/certificate-record';
import { formatOhm } from '../../shared/domain/units';
import { stepsForKind } from '../../shared/domain/checklist';
import type { TestKind } from '../../shared/domain/limits';
import {
  formatDateRange,
  formatUtc,
  limitText,
  ruleLabel,
  testLabel,
  timeUtc,
  verdictLabel,
  verdictMark,
  Writer,
} from './certificate-writer';

export interface CertificateDocument {
  payload: CertificatePayload;
  jws: string;
  keyId: string;
  /** Venue: all certified readings; strip: that strip's. */
  readings: CertifiedReading[];
}

const shortSource = (source: string) =>
  source.replace(/^FIE Material Rules, art\. /, 'FIE art. ').replace(/^House rule \(no published value\)$/, 'House rule');
const valueText = (r: CertifiedReading) => (r.overRange ? 'OL' : r.valueOhm === null ? r.valueText : formatOhm(r.valueOhm));
const verdictColour = (v: CertifiedReading['verdict']) => (v === 'pass' ? COLOURS.pass : v === 'near-limit' ? COLOURS.near : COLOURS.fail);

function readingColumns(): Column<CertifiedReading>[] {
  return [
    { header: 'Strip', width: 52, value: (r) => r.stripLabel, style: () => ({ weight: 500 }) },
    { header: 'Position', width: 74, value: (r) => r.position },
    { header: 'Asset tag', width: 50, value: (r) => r.assetTag ?? '—', nowrap: true },
    { header: 'Test', width: 76, value: (r) => testLabel(r.testKind) },
    { header: 'Wires', width: 40, value: (r) => (r.conductors.startsWith('piste') ? '—' : r.conductors), nowrap: true },
    { header: 'Value', width: 48, align: 'right', value: valueText, nowrap: true, style: () => ({ weight: 500 }) },
    { header: 'Limit', width: 62, value: limitText, nowrap: true },
    {
      header: 'Verdict',
      width: 60,
      value: (r) => verdictLabel(r.verdict),
      nowrap: true,
      style: (r) => ({ color: verdictColour(r.verdict), weight: 500 }),
      mark: (r, pen, x, y, size) => verdictMark(pen, r.verdict, x, y, size),
    },
    { header: 'Source', width: 84, value: (r) => shortSource(r.source), nowrap: true },
    { header: 'Tester', width: 70, value: (r) => r.takenBy },
    { header: 'Taken (UTC)', width: 62, value: (r) => timeUtc(r.takenAt), nowrap: true },
  ];
}

function testedLine(p: CertificatePayload) {
  const [a, b] = [formatUtc(p.testedFrom), formatUtc(p.testedTo)];
  if (a.slice(0, -10) === b.slice(0, -10)) return `${a.slice(0, -4)}–${b.slice(-9)}`;
  return `${a} to ${b}`;
}

function commonFacts(p: CertificatePayload): [string, string][] {
  return [
    ['Limit profile', `${p.profile.name}, version ${p.profile.version}`],
    ['Tested by', p.testedBy.map((t) => t.name).join(', ') || '—'],
    ['Testing', testedLine(p)],
    ['Signed by', `${p.signer.name}, ${p.signer.role}`],
    ['Signed', formatUtc(p.signedAt)],
  ];
}

function limitsTable(w: Writer, rules: CertificatePayload['profile']['rules'], size = 7.5, withNotes = false, padY = 2.4) {
  type Rule = CertificatePayload['profile']['rules'][number];
  const columns: Column<Rule>[] = [
    { header: 'Equipment and test', width: 130, value: (r) => ruleLabel(r.id), style: () => ({ weight: 500 }) },
    { header: 'Limit', width: 150, value: (r) => r.limit },
    { header: 'Source', width: 170, value: (r) => r.source },
  ];
  if (withNotes) columns.push({ header: 'Note', width: 330, value: (r) => r.note ?? '', style: () => ({ color: COLOURS.soft }) });
  w.table(rules, columns, { size, headerSize: 6, padY });
}

function renderVenue(w: Writer, doc: CertificateDocument) {
  const { payload: p } = doc;
  w.newPage('portrait');
  w.eyebrow('Venue certificate · electrical testing of competition equipment');
  w.title(p.venue.name, `${p.event.name} · ${formatDateRange(p.event.startsOn, p.event.endsOn)} · ${p.issuer.organisation.name}`);
  const certified = p.strips.length;
  const total = certified + p.exceptions.length;
  w.text(
    `This certifies that the competition equipment of the ${certified === 1 ? 'strip' : `${certified} strips`} listed below was tested strip by strip, and that the latest reading of every required test was within the limits of the profile named here when the venue was signed off. The limits and their sources are in Annex A, every reading in Annex B.`,
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
    ...commonFacts(p),
    ['Organisation', p.issuer.organisation.name],
  ]);

  w.section('Strips certified');
  const stripNo = new Map(p.related.stripCertificates.map((s) => [s.stripId, s.number]));
  w.table(p.strips, [
    { header: 'Strip', width: 58, value: (s) => s.label, style: () => ({ weight: 500 }) },
    { header: 'Zone', width: 46, value: (s) => s.zone ?? '—' },
    { header: 'Items by asset tag', width: 150, value: (s) => s.items.map((i) => i.assetTag ?? i.position).join(', ') },
    { header: 'Readings', width: 46, align: 'right', value: (s) => String(s.readings) },
    { header: 'Near limit', width: 46, align: 'right', value: (s) => String(s.nearLimit) },
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
  w.signature(doc.jws, doc.keyId);

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
    `The latest reading of every required test on the certified strips, as signed: ${p.readings.count} readings. SHA-256 of the list in canonical JSON (RFC 8785): ${p.readings.digest}.`,
    { size: 8, color: COLOURS.soft },
    8,
  );
  w.table(doc.readings, readingColumns(), { size: 7.5, headerSize: 6, padY: 2.6, zebra: true });
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
      ['Venue', `${p.venue.name}${strip.zone ? `, ${strip.zone}` : ''}`],
      ['Items by asset tag', strip.items.map((i) => i.assetTag ?? i.position).join(', ')],
      ['Readings', `${strip.readings}${strip.nearLimit ? `, ${strip.nearLimit} near limit` : ', none near limit'}`],
      ...commonFacts(p).filter(([k]) => k !== 'Limit profile'),
      ['Venue certificate', p.related.venueCertificate ?? '—'],
    ],
    4,
  );
  w.section('Readings', 40);
  const grid = readingGrid(doc.readings);
  w.table(grid.rows, grid.columns, { size: 7.5, headerSize: 6, padY: 3.4 });
  w.text(
    `Values are the latest reading of each test, in ohms; OL is over range (open), which passes for insulation. A tick is a pass, a triangle a pass near the limit.`,
    { size: 7, color: COLOURS.soft },
    6,
  );
  w.section(`Limits applied: ${p.profile.name}, version ${p.profile.version}`, 30);
  const used = new Set(doc.readings.map((r) => r.ruleId));
  w.ruleList(p.profile.rules.filter((r) => used.has(r.id)).map((r) => [ruleLabel(r.id), `${r.limit} · ${r.source}`]));
  w.text(`Statement of the technical director: “${p.statement}”`, { size: 8, color: COLOURS.ink }, 10);
  w.scope();
  w.signature(doc.jws, doc.keyId);
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
  const w = new Writer(doc, p, `${what} · ${p.event.name} · ${p.venue.name}`);
  if (p.kind === 'venue') renderVenue(w, input);
  else renderStrip(w, input);
  w.footers();
  return toBuffer(doc);
}
