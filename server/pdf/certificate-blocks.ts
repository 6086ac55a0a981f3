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

// The strip's equipment by kind, the scoring apparatus first, in the order a strip is wired.
const KIND_ORDER = ['apparatus', 'floor-cable', 'reel', 'piste', 'body-wire', 'other'];
const KIND_WORDS: Record<string, [string, string]> = {
  apparatus: ['Scoring apparatus', 'Scoring apparatus'],
  'floor-cable': ['Floor cable', 'Floor cables'],
  reel: ['Reel', 'Reels'],
  piste: ['Piste', 'Pistes'],
  'body-wire': ['Body wire', 'Body wires'],
  other: ['Other item', 'Other items'],
};
type Item = CertificatePayload['strips'][number]['items'][number];

function byKind(items: Item[]): [string, Item[]][] {
  const rank = (k: string) => (KIND_ORDER.includes(k) ? KIND_ORDER.indexOf(k) : KIND_ORDER.length);
  const kinds = [...new Set(items.map((i) => i.kind))].sort((a, b) => rank(a) - rank(b));
  return kinds.map((k) => {
    const list = items.filter((i) => i.kind === k);
    const [one, many] = KIND_WORDS[k] ?? [k, k];
    return [list.length === 1 ? one : many, list];
  });
}

/** One item in words: its tag, the position when the kind alone does not say it, and "not measured". */
function itemWords(i: Item, kindWord: string) {
  const where = i.position.trim().toLowerCase() === kindWord.toLowerCase() ? '' : ` (${i.position})`;
  return `${i.assetTag ?? 'no asset tag recorded'}${where}${i.measured === false ? ', not measured' : ''}`;
}

/** The strip certificate's facts: one line per kind, the scoring apparatus first. */
export function equipmentFacts(items: Item[]): [string, string][] {
  return byKind(items).map(([word, list]) => [word, list.map((i) => itemWords(i, word)).join(', ')]);
}

/**
 * The venue certificate's cell, in the column order its header names: the scoring apparatus, the
 * floor cables, the reels, then the piste and any other item where the strip has one
 * ("APP-001 · FC-001, FC-002 · RL-001, RL-002"). A dash holds the place of a kind the strip lacks.
 */
export function equipmentSummary(items: Item[]): string {
  const tags = (kind: string) => items.filter((i) => i.kind === kind).map((i) => i.assetTag ?? 'no tag');
  const slot = (kind: string) => tags(kind).join(', ') || '—';
  const rest = byKind(items.filter((i) => !['apparatus', 'floor-cable', 'reel', 'piste'].includes(i.kind))).map(
    ([word, list]) => `${word.toLowerCase()} ${list.map((i) => i.assetTag ?? 'no tag').join(', ')}`,
  );
  return [slot('apparatus'), slot('floor-cable'), slot('reel'), ...(tags('piste').length ? [slot('piste')] : []), ...rest].join(' · ');
}
