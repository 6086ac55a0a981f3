// Blocks both certificates use: the readings table's columns, the facts every certificate states,
// the list of limits and sources, the lead nulls and the dismissed faults.
import { COLOURS, type Column } from './layout';
import type { CertificatePayload, CertifiedReading, DismissedFault } from '../signing/certificate-record';
import { formatOhm } from '../../shared/domain/units';
import { type Clock, limitText, testLabel, verdictLabel, ruleLabel, verdictColour, verdictMark, Writer } from './certificate-writer';

export const shortSource = (source: string) =>
  source.replace(/^FIE Material Rules, art\. /, 'FIE art. ').replace(/^House rule \(no published value\)$/, 'House rule');
export const valueText = (r: CertifiedReading) => (r.overRange ? 'OL' : r.valueOhm === null ? r.valueText : formatOhm(r.valueOhm));
/** The test-lead null subtracted from what the meter showed, or a dash. */
export const leadNullText = (r: CertifiedReading) => (r.overRange || !r.leadNullOhm ? '—' : `− ${formatOhm(r.leadNullOhm)}`);
export const FAULT_KIND: Record<string, string> = {
  short: 'Short',
  open: 'Open line',
  'high-resistance': 'High resistance',
  intermittent: 'Intermittent',
};

export function readingColumns(clock: Clock): Column<CertifiedReading>[] {
  return [
    { header: 'Strip', width: 52, value: (r) => r.stripLabel, style: () => ({ weight: 500 }) },
    { header: 'Position', width: 74, value: (r) => r.position },
    { header: 'Asset tag', width: 50, value: (r) => r.assetTag ?? '—', nowrap: true },
    { header: 'Test', width: 76, value: (r) => testLabel(r.testKind) },
    { header: 'Wires', width: 40, value: (r) => (r.conductors.startsWith('piste') ? '—' : r.conductors), nowrap: true },
    { header: 'Value', width: 48, align: 'right', value: valueText, nowrap: true, style: () => ({ weight: 500 }) },
    { header: 'Lead null', width: 42, align: 'right', value: leadNullText, nowrap: true, style: () => ({ color: COLOURS.soft }) },
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
    { header: `Taken (${clock.offset})`, width: 62, value: (r) => clock.short(r.takenAt), nowrap: true },
  ];
}

export function testedLine(p: CertificatePayload, clock: Clock) {
  const [a, b] = [p.testedFrom, p.testedTo];
  // One day: one line (the offset is on the Signed line beside it).
  if (clock.day(a) === clock.day(b)) return `${clock.day(a)}, ${clock.time(a)}–${clock.time(b)}`;
  return `${clock.dateTime(a)} to ${clock.dateTime(b)}`;
}

export function commonFacts(p: CertificatePayload, clock: Clock): [string, string][] {
  return [
    ['Limit profile', `${p.profile.name}, version ${p.profile.version}`],
    ...(p.profile.temperature ? ([['Temperature', p.profile.temperature]] as [string, string][]) : []),
    ['Tested by', p.testedBy.map((t) => t.name).join(', ') || '—'],
    ['Testing', testedLine(p, clock)],
    ['Signed by', `${p.signer.name}, ${p.signer.role}`],
    ['Signed', clock.dateTime(p.signedAt)],
  ];
}

export function limitsTable(w: Writer, rules: CertificatePayload['profile']['rules'], size = 7.5, withNotes = false, padY = 2.4) {
  type Rule = CertificatePayload['profile']['rules'][number];
  const columns: Column<Rule>[] = [
    { header: 'Equipment and test', width: 130, value: (r) => ruleLabel(r.id), style: () => ({ weight: 500 }) },
    { header: 'Limit', width: 150, value: (r) => r.limit },
    { header: 'Source', width: 170, value: (r) => r.source },
  ];
  if (withNotes) columns.push({ header: 'Note', width: 330, value: (r) => r.note ?? '', style: () => ({ color: COLOURS.soft }) });
  w.table(rules, columns, { size, headerSize: 6, padY });
}

/** The test-lead nulls the readings used: who measured each, when, with which meter. */
export function leadNullsTable(w: Writer, p: CertificatePayload) {
  type Row = CertificatePayload['leadNulls'][number];
  if (p.leadNulls.length === 0) {
    w.text('No test-lead null was subtracted from these readings.', { size: 8.5, color: COLOURS.soft }, 8);
    return;
  }
  w.table<Row>(
    p.leadNulls,
    [
      { header: 'Measured by', width: 120, value: (n) => n.takenBy, style: () => ({ weight: 500 }) },
      { header: `When (${w.clock.offset})`, width: 90, value: (n) => w.clock.short(n.takenAt), nowrap: true },
      { header: 'Leads read', width: 60, align: 'right', value: (n) => formatOhm(n.valueOhm), nowrap: true },
      { header: 'Meter', width: 140, value: (n) => n.meter ?? '—' },
      { header: 'Readings using it', width: 70, align: 'right', value: (n) => String(n.readings) },
    ],
    { size: 7.5, headerSize: 6, padY: 2.6 },
  );
}

/** Faults the director closed as typing mistakes, each with the reason given. */
export function dismissedTable(w: Writer, faults: DismissedFault[], withStrip = true) {
  if (faults.length === 0) {
    w.text('None: every fault on these strips was closed by a repair and a passing retest.', { size: 8.5, color: COLOURS.soft }, 8);
    return;
  }
  const columns: Column<DismissedFault>[] = [
    { header: 'Position', width: 80, value: (f) => f.position },
    {
      header: 'Fault',
      width: 90,
      value: (f) => `${FAULT_KIND[f.kind] ?? f.kind} ${f.conductors.startsWith('piste') ? '' : f.conductors}`.trim(),
    },
    { header: `Opened (${w.clock.offset})`, width: 62, value: (f) => w.clock.short(f.openedAt) },
    { header: 'Dismissed by', width: 90, value: (f) => `${f.dismissedBy}, ${w.clock.short(f.dismissedAt)}` },
    { header: 'Reason', width: withStrip ? 300 : 220, value: (f) => f.reason },
  ];
  if (withStrip) columns.unshift({ header: 'Strip', width: 52, value: (f) => f.stripLabel, style: () => ({ weight: 500 }) });
  w.table(faults, columns, { size: 7.5, headerSize: 6, padY: 2.6 });
}
