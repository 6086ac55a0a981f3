// The record of the competition days: every incident of a venue (strip, item, symptom, swap, the
// readings of the retest, minutes out of service) and the totals per strip and per item kind.
import { COLOURS, createDocument, Pen, table, toBuffer, type Column } from './layout';
import { clockFor, frameFor, MARGIN_X } from './certificate-writer';

export interface ReportIncident {
  strip: string;
  item: string;
  kind: string;
  symptom: string;
  swap: string;
  readings: string;
  openedAt: string;
  resolvedAt: string | null;
  minutes: number;
}

export interface IncidentReportInput {
  event: string;
  venue: string;
  organisation: string;
  generatedAt: string;
  /** The venue's zone: every time in the report is written in it, with its offset. */
  timeZone: string;
  incidents: ReportIncident[];
  perStrip: { label: string; incidents: number; minutes: number }[];
  perKind: { label: string; incidents: number; minutes: number }[];
}

export async function renderIncidentReport(r: IncidentReportInput): Promise<Buffer> {
  const clock = clockFor(r.timeZone, r.generatedAt);
  const doc = createDocument({
    title: `Incidents: ${r.venue}`,
    subject: `Incident report, ${r.event}`,
    keywords: 'incidents, strips, competition',
    creationDate: new Date(r.generatedAt),
  });
  const pen = new Pen(doc);
  const frame = frameFor('landscape');
  const newPage = () => {
    doc.addPage({ size: 'A4', layout: 'landscape', margin: 0 });
    return frame.top;
  };
  let y = newPage();
  pen.line('Incident report', MARGIN_X, y, { size: 18, weight: 700, color: COLOURS.brand });
  y += 26;
  pen.line(`${r.event} · ${r.venue} · ${r.organisation}`, MARGIN_X, y, { size: 10, color: COLOURS.ink });
  y += 16;
  pen.line(`Made ${clock.dateTime(r.generatedAt)}. ${r.incidents.length} incident(s).`, MARGIN_X, y, { size: 9, color: COLOURS.soft });
  y += 22;
  const cols: Column<ReportIncident>[] = [
    { header: 'Strip', width: 60, value: (i) => i.strip },
    { header: 'Item', width: 80, value: (i) => i.item },
    { header: 'Symptom', width: 150, value: (i) => i.symptom },
    { header: 'Swap', width: 120, value: (i) => i.swap },
    { header: 'Retest readings', width: 170, value: (i) => i.readings },
    { header: `Opened (${clock.offset})`, width: 80, value: (i) => clock.short(i.openedAt) },
    { header: 'Back', width: 80, value: (i) => (i.resolvedAt ? clock.short(i.resolvedAt) : 'still open') },
    { header: 'Minutes out', width: 50, align: 'right', value: (i) => String(i.minutes) },
  ];
  y = table(pen, r.incidents, cols, y, frame, newPage, { zebra: true });
  const totals = (title: string, rows: IncidentReportInput['perStrip']) => {
    if (y + 60 > frame.bottom) y = newPage();
    y += 18;
    pen.line(title, MARGIN_X, y, { size: 11, weight: 600 });
    y += 18;
    y = table(
      pen,
      rows,
      [
        { header: title.replace('Totals per ', ''), width: 200, value: (t) => t.label },
        { header: 'Incidents', width: 80, align: 'right', value: (t) => String(t.incidents) },
        { header: 'Minutes out of service', width: 120, align: 'right', value: (t) => String(t.minutes) },
      ],
      y,
      { ...frame, right: frame.left + 400 },
      newPage,
    );
  };
  totals('Totals per strip', r.perStrip);
  totals('Totals per item kind', r.perKind);
  return toBuffer(doc);
}
