import { Link } from 'react-router';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { READING_SYMBOLS, STRIP_SYMBOLS } from '@shared/domain/symbols';
import { INCIDENT_STATUS_LABELS } from '@shared/schemas/incidents';
import { DataTable, plainTableLook } from '@/components/ui/data-table';
import { SymbolMark } from '@/components/ui/status-mark';
import { minutesText } from '@/lib/minutes';
import type { Dates } from '@/lib/date-format';
import type { Incident } from '../api/get-venue-incidents';

const col = createColumnHelper<Incident>();

/** Open: the strip is out of service (its mark); back in service: the pass mark. */
const statusLook = (i: Incident) => (i.status === 'open' ? STRIP_SYMBOLS['out-of-service'] : READING_SYMBOLS.pass);

/** The columns; times in the venue's clock (`dates` from useDates on the venue's page). */
export const incidentColumns = (stripHref: (stripId: string) => string, verifyHref: (number: string) => string, dates: Dates) => [
  col.accessor('stripLabel', {
    header: 'Strip',
    cell: (c) => (
      <Link to={stripHref(c.row.original.stripId)} className="inline-flex min-h-touch items-center font-semibold text-brand underline">
        {c.getValue()}
      </Link>
    ),
  }),
  col.display({
    id: 'what',
    header: 'What went wrong',
    cell: (c) => {
      const i = c.row.original;
      return (
        <>
          {i.symptom}
          <span className="block text-xs text-ink-soft">
            {i.positionName ?? 'Whole strip'}
            {i.equipment ? ` · ${i.equipment.assetTag}` : ''}
            {i.swaps.map((s) => ` · swapped ${s.removed?.assetTag ?? 'empty'} → ${s.replacement.assetTag}`).join('')}
          </span>
        </>
      );
    },
  }),
  col.accessor('status', {
    header: 'State',
    cell: (c) => <SymbolMark look={statusLook(c.row.original)} label={INCIDENT_STATUS_LABELS[c.getValue()]} size="sm" />,
  }),
  col.display({
    id: 'time',
    header: 'Out of service',
    meta: { cellClassName: 'tabular-nums' },
    cell: (c) => {
      const i = c.row.original;
      return (
        <>
          <strong>{minutesText(i.minutesOutOfService)}</strong>
          <span className="block text-xs text-ink-soft">
            {dates.shortDateTime(i.openedAt)} → {i.resolvedAt ? dates.shortDateTime(i.resolvedAt) : 'now'}
          </span>
        </>
      );
    },
  }),
  col.display({
    id: 'amended',
    header: 'Amendment',
    cell: (c) => {
      const a = c.row.original.amendment;
      return a ? (
        <Link to={verifyHref(a.number)} className="font-mono text-sm text-brand underline">
          {a.number}
        </Link>
      ) : (
        <span className="text-ink-soft">{c.row.original.status === 'resolved' ? 'to amend' : '—'}</span>
      );
    },
  }),
];

export function IncidentsTable({ incidents, columns }: { incidents: Incident[]; columns: ReturnType<typeof incidentColumns> }) {
  const table = useReactTable({ data: incidents, columns, getCoreRowModel: getCoreRowModel(), getRowId: (i) => i.id });
  if (incidents.length === 0) return <p className="p-5 text-ink-soft">No incidents. Every strip is in service.</p>;
  return (
    <DataTable
      table={table}
      look={plainTableLook}
      rowProps={(r) => ({ 'data-incident': r.original.stripLabel, 'data-state': r.original.status })}
    />
  );
}
