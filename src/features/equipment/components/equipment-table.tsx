import { useMemo } from 'react';
import { Link } from 'react-router';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import type { LengthSystem } from '@shared/domain/units';
import { EQUIPMENT_KIND_LABELS, EQUIPMENT_STATUS_LABELS } from '@shared/schemas/equipment';
import { DataTable, plainTableLook } from '@/components/ui/data-table';
import { StatusMark, SymbolMark } from '@/components/ui/status-mark';
import { OTHER_SYMBOLS } from '@shared/domain/symbols';
import type { EquipmentItem } from '../api/types';
import { lengthText } from './labels';

export function EquipmentStatusMark({ status }: { status: EquipmentItem['status'] }) {
  const look = { 'in-service': ['circle', 'pass'], 'under-repair': ['half', 'near'], retired: ['dash', 'idle'] } as const;
  const [shape, tone] = look[status];
  return <StatusMark shape={shape} tone={tone} label={EQUIPMENT_STATUS_LABELS[status]} size="sm" />;
}

/** Taken out of a strip during an incident: someone must look at it (the caution mark). */
export function ToInspectMark() {
  return <SymbolMark look={OTHER_SYMBOLS.caution} label="To inspect" size="sm" />;
}

const col = createColumnHelper<EquipmentItem>();
const look = { ...plainTableLook, td: 'px-4 py-1' };

export function EquipmentTable({
  items,
  itemHref,
  system,
}: {
  items: EquipmentItem[];
  itemHref: (id: string) => string;
  system: LengthSystem;
}) {
  const columns = useMemo(
    () => [
      col.accessor('assetTag', {
        header: 'Asset tag',
        cell: (c) => (
          <Link
            to={itemHref(c.row.original.id)}
            className="inline-flex min-h-touch items-center font-mono font-semibold text-brand underline"
          >
            {c.getValue()}
          </Link>
        ),
      }),
      col.accessor('kind', { header: 'Kind', cell: (c) => EQUIPMENT_KIND_LABELS[c.getValue()] }),
      col.accessor('description', { header: 'Description', cell: (c) => c.getValue() || '—', meta: { cellClassName: 'text-ink-soft' } }),
      col.accessor('lengthM', {
        header: 'Length',
        cell: (c) => lengthText(c.getValue(), system),
        meta: { className: 'text-right', cellClassName: 'tabular-nums' },
      }),
      col.accessor('status', {
        header: 'Status',
        cell: (c) => (
          <span className="flex flex-wrap gap-1">
            <EquipmentStatusMark status={c.getValue()} />
            {c.row.original.toInspectIncidentId && <ToInspectMark />}
          </span>
        ),
      }),
    ],
    [itemHref, system],
  );
  const table = useReactTable({ data: items, columns, getCoreRowModel: getCoreRowModel(), getRowId: (i) => i.id });
  if (items.length === 0) return <p className="p-5 text-ink-soft">No items match these filters.</p>;
  return <DataTable table={table} look={look} />;
}
