import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import type { LimitRule } from '@shared/domain/limits';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { formatOhm } from '@shared/domain/units';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { DataTable, plainTableLook } from '@/components/ui/data-table';
import { StatusMark } from '@/components/ui/status-mark';

export function limitText(r: LimitRule) {
  if (r.minOhm !== undefined) return `at least ${formatOhm(r.minOhm)}`;
  if (r.maxOhmPerMetre !== undefined)
    return `at most ${formatOhm(r.maxOhmPerMetre)}/m${r.connectorAllowanceOhm ? ` + ${formatOhm(r.connectorAllowanceOhm)}` : ''}`;
  if (r.maxOhm !== undefined) return `at most ${formatOhm(r.maxOhm)}`;
  return '—';
}
function nearText(r: LimitRule) {
  if (r.nearMinOhm !== undefined) return `below ${formatOhm(r.nearMinOhm)}`;
  if (r.nearLimitFraction !== undefined) return `above ${Math.round(r.nearLimitFraction * 100)} %`;
  return '—';
}

export function HouseRuleMark({ house }: { house: boolean }) {
  return house ? (
    <StatusMark shape="box" tone="brass" label="House rule" size="sm" />
  ) : (
    <StatusMark shape="square" tone="brand" label="Published" size="sm" />
  );
}

const col = createColumnHelper<LimitRule>();
const columns = [
  col.accessor('equipmentKind', { header: 'Equipment', cell: (c) => EQUIPMENT_KIND_LABELS[c.getValue()] }),
  col.accessor('testKind', { header: 'Test', cell: (c) => TEST_KIND_LABELS[c.getValue()] }),
  col.display({
    id: 'limit',
    header: 'Limit',
    cell: (c) => limitText(c.row.original),
    meta: { cellClassName: 'font-semibold tabular-nums' },
  }),
  col.display({ id: 'near', header: 'Near limit', cell: (c) => nearText(c.row.original), meta: { cellClassName: 'tabular-nums' } }),
  col.accessor('source', {
    header: 'Source',
    cell: (c) => (
      <div className="flex flex-col items-start gap-1">
        <HouseRuleMark house={c.row.original.houseRule} />
        <span>{c.getValue()}</span>
        {c.row.original.note && <span className="text-xs text-ink-soft">{c.row.original.note}</span>}
      </div>
    ),
  }),
];
const look = { ...plainTableLook, row: 'border-b border-line align-top last:border-0', td: 'px-4 py-3' };

/** The rules of one profile version, read only, with their sources. */
export function RulesTable({ rules }: { rules: LimitRule[] }) {
  const table = useReactTable({ data: rules, columns, getCoreRowModel: getCoreRowModel(), getRowId: (r) => r.id });
  return <DataTable table={table} look={look} />;
}
