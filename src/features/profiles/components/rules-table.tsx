import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import type { LimitRule } from '@shared/domain/limits';
import { EQUIPMENT_KIND_LABELS } from '@shared/schemas/equipment';
import { formatOhm } from '@shared/domain/units';
import { StatusMark } from '@/components/ui/status-mark';

export function limitText(r: LimitRule) {
  if (r.minOhm !== undefined) return `at least ${formatOhm(r.minOhm)}`;
  if (r.maxOhmPerMetre !== undefined) return `at most ${formatOhm(r.maxOhmPerMetre)}/m${r.connectorAllowanceOhm ? ` + ${formatOhm(r.connectorAllowanceOhm)}` : ''}`;
  if (r.maxOhm !== undefined) return `at most ${formatOhm(r.maxOhm)}`;
  return '—';
}
function nearText(r: LimitRule) {
  if (r.nearMinOhm !== undefined) return `below ${formatOhm(r.nearMinOhm)}`;
  if (r.nearLimitFraction !== undefined) return `above ${Math.round(r.nearLimitFraction * 100)} %`;
  return '—';
}

export function HouseRuleMark({ house }: { house: boolean }) {
  return house ? <StatusMark shape="box" tone="brass" label="House rule" size="sm" /> : <StatusMark shape="square" tone="brand" label="Published" size="sm" />;
}

/** The rules of one profile version, read only, with their sources. */
export function RulesTable({ rules }: { rules: LimitRule[] }) {
  return (
    <table className="w-full text-left text-sm">
      <thead className="border-b border-line bg-paper text-xs uppercase tracking-wide text-ink-soft">
        <tr>
          <th className="px-4 py-3">Equipment</th>
          <th className="px-4 py-3">Test</th>
          <th className="px-4 py-3">Limit</th>
          <th className="px-4 py-3">Near limit</th>
          <th className="px-4 py-3">Source</th>
        </tr>
      </thead>
      <tbody>
        {rules.map((r) => (
          <tr key={r.id} className="border-b border-line align-top last:border-0">
            <td className="px-4 py-3">{EQUIPMENT_KIND_LABELS[r.equipmentKind]}</td>
            <td className="px-4 py-3">{TEST_KIND_LABELS[r.testKind]}</td>
            <td className="px-4 py-3 font-semibold tabular-nums">{limitText(r)}</td>
            <td className="px-4 py-3 tabular-nums">{nearText(r)}</td>
            <td className="px-4 py-3">
              <div className="flex flex-col items-start gap-1">
                <HouseRuleMark house={r.houseRule} />
                <span>{r.source}</span>
                {r.note && <span className="text-xs text-ink-soft">{r.note}</span>}
              </div>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
