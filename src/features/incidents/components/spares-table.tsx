import { Link } from 'react-router';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { READING_SYMBOLS, STRIP_SYMBOLS } from '@shared/domain/symbols';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { DataTable, plainTableLook } from '@/components/ui/data-table';
import { SymbolMark } from '@/components/ui/status-mark';
import type { Spare } from '../api/get-spares';

const col = createColumnHelper<Spare>();

/** Built per call so the links can go where the page says; the page memoises it. */
export const spareColumns = (hrefs: { item: (id: string) => string; strip: (id: string) => string }) => [
  col.accessor((s) => s.equipment.assetTag, {
    id: 'tag',
    header: 'Asset tag',
    cell: (c) => (
      <Link
        to={hrefs.item(c.row.original.equipment.id)}
        className="inline-flex min-h-touch items-center font-mono font-semibold text-brand underline"
      >
        {c.getValue()}
      </Link>
    ),
  }),
  col.accessor((s) => s.equipment.kind, { id: 'kind', header: 'Kind', cell: (c) => EQUIPMENT_KIND_LABELS[c.getValue()] }),
  col.display({
    id: 'tested',
    header: 'Tested here',
    cell: (c) => {
      const s = c.row.original;
      const look = s.tested ? READING_SYMBOLS.pass : s.stepsPassed > 0 ? STRIP_SYMBOLS['in-progress'] : READING_SYMBOLS['not-measured'];
      return (
        <span className="flex flex-wrap items-center gap-2" data-tested={s.tested ? 'yes' : 'no'}>
          <SymbolMark look={look} label={s.tested ? 'Tested' : 'Not tested yet'} size="sm" />
          <span className="text-xs tabular-nums text-ink-soft">
            {s.stepsPassed} of {s.stepsTotal} steps pass
          </span>
        </span>
      );
    },
  }),
  col.display({
    id: 'used',
    header: 'Where now',
    cell: (c) => {
      const u = c.row.original.usedIn;
      return u ? (
        <Link to={hrefs.strip(u.stripId)} className="text-brand underline">
          In {u.stripLabel}, {u.positionName}
        </Link>
      ) : (
        <span className="text-ink-soft">In the pool</span>
      );
    },
  }),
];

export function SparesTable({ spares, columns }: { spares: Spare[]; columns: ReturnType<typeof spareColumns> }) {
  const table = useReactTable({ data: spares, columns, getCoreRowModel: getCoreRowModel(), getRowId: (s) => s.equipment.id });
  if (spares.length === 0) return <p className="p-5 text-ink-soft">No spares in the pool yet.</p>;
  return <DataTable table={table} look={plainTableLook} rowProps={(r) => ({ 'data-spare': r.original.equipment.assetTag })} />;
}
