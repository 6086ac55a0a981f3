import { Link } from 'react-router';
import type { LengthSystem } from '@shared/domain/units';
import { EQUIPMENT_KIND_LABELS, EQUIPMENT_STATUS_LABELS } from '@shared/schemas/equipment';
import { StatusMark } from '@/components/ui/status-mark';
import type { EquipmentItem } from '../api/types';
import { lengthText } from './labels';

export function EquipmentStatusMark({ status }: { status: EquipmentItem['status'] }) {
  const look = { 'in-service': ['circle', 'pass'], 'under-repair': ['half', 'near'], retired: ['dash', 'idle'] } as const;
  const [shape, tone] = look[status];
  return <StatusMark shape={shape} tone={tone} label={EQUIPMENT_STATUS_LABELS[status]} size="sm" />;
}

export function EquipmentTable({ items, itemHref, system }: { items: EquipmentItem[]; itemHref: (id: string) => string; system: LengthSystem }) {
  if (items.length === 0) return <p className="p-5 text-ink-soft">No items match these filters.</p>;
  return (
    <table className="w-full text-left text-sm">
      <thead className="border-b border-line bg-paper text-xs uppercase tracking-wide text-ink-soft">
        <tr>
          <th className="px-4 py-3">Asset tag</th>
          <th className="px-4 py-3">Kind</th>
          <th className="px-4 py-3">Description</th>
          <th className="px-4 py-3 text-right">Length</th>
          <th className="px-4 py-3">Status</th>
        </tr>
      </thead>
      <tbody>
        {items.map((i) => (
          <tr key={i.id} className="border-b border-line last:border-0">
            <td className="px-4 py-1">
              <Link to={itemHref(i.id)} className="inline-flex min-h-touch items-center font-mono font-semibold text-brand underline">
                {i.assetTag}
              </Link>
            </td>
            <td className="px-4 py-1">{EQUIPMENT_KIND_LABELS[i.kind]}</td>
            <td className="px-4 py-1 text-ink-soft">{i.description || '—'}</td>
            <td className="px-4 py-1 text-right tabular-nums">{lengthText(i.lengthM, system)}</td>
            <td className="px-4 py-1"><EquipmentStatusMark status={i.status} /></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
