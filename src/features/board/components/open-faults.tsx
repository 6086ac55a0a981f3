import { Link } from 'react-router';
import { FAULT_SYMBOLS } from '@shared/domain/symbols';
import { formatLength, type LengthSystem } from '@shared/domain/units';
import { FAULT_KIND_LABELS, FAULT_STATUS_LABELS } from '@shared/schemas/faults';
import { StatusMark } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';
import type { BoardFault } from '../api/get-board';

export function OpenFaultsList({ faults, unitSystem }: { faults: BoardFault[]; unitSystem: LengthSystem }) {
  if (faults.length === 0) return <p className="text-sm text-ink-soft">No open faults.</p>;
  return (
    <ul className="divide-y divide-line">
      {faults.map((f) => (
        <li key={f.id} className="flex flex-wrap items-center gap-x-3 gap-y-1 py-2">
          <StatusMark
            shape={FAULT_SYMBOLS[f.status].shape}
            tone={FAULT_SYMBOLS[f.status].tone}
            label={FAULT_STATUS_LABELS[f.status]}
            size="sm"
          />
          <Link to={paths.fault(f.id)} className="min-h-touch inline-flex items-center font-medium text-brand underline">
            {f.stripLabel} · {f.positionName}
          </Link>
          <span className="text-sm">
            {FAULT_KIND_LABELS[f.kind]} ({f.conductors}){f.equipment ? ` · ${f.equipment.assetTag}` : ''}
          </span>
          {f.estimate && (
            <span className="text-sm text-ink-soft">
              about {formatLength(f.estimate.distanceM, unitSystem)} ±{formatLength(f.estimate.uncertaintyM, unitSystem)} from the{' '}
              {f.estimate.fromEnd === 'near' ? 'apparatus end' : 'far end'}
            </span>
          )}
        </li>
      ))}
    </ul>
  );
}
