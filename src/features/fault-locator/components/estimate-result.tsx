import type { FaultLocationAnswer } from '@shared/domain/fault-location';
import { formatLength, formatOhm, type LengthSystem } from '@shared/domain/units';
import { CableDrawing } from '@/components/ui/cable-drawing';

export interface EstimateResultProps {
  answer: FaultLocationAnswer;
  lengthM?: number | undefined;
  unitSystem: LengthSystem;
  /** Whether the numbers were worked out in this browser or confirmed by the server. */
  source: 'browser' | 'server';
  nearLabel?: string;
  /** Words and numbers only, no drawing (where the page draws the cable already). */
  compact?: boolean;
}

/** The estimate in words and numbers, on a drawing of the cable to scale. */
export function EstimateResult({ answer, lengthM, unitSystem, source, nearLabel = 'near end', compact = false }: EstimateResultProps) {
  const fmt = (m: number) => formatLength(m, unitSystem);
  const cableLengthM = lengthM ?? (answer.fromOtherEndM !== undefined ? answer.distanceM + answer.fromOtherEndM : undefined);
  return (
    <section aria-label="Estimate" className="flex flex-col gap-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="text-ink">
          <span data-testid="fault-distance" className="text-2xl font-semibold">
            {fmt(answer.distanceM)}
          </span>{' '}
          <span className="text-ink-soft">from the {nearLabel}</span>{' '}
          <span data-testid="fault-uncertainty" className="font-medium">
            ±{fmt(answer.uncertaintyM)}
          </span>
        </p>
        <span
          className={`rounded-full px-3 py-1 text-xs font-medium ${source === 'server' ? 'bg-pass-soft text-pass' : 'bg-idle-soft text-ink-soft'}`}
        >
          {source === 'server' ? '✓ Checked by the server' : 'Worked out as you type'}
        </span>
      </div>
      <dl className="grid grid-cols-2 gap-x-6 gap-y-1 text-sm sm:grid-cols-3">
        {answer.fromOtherEndM !== undefined && (
          <div>
            <dt className="text-ink-soft">From the far end</dt>
            <dd className="font-medium">{fmt(answer.fromOtherEndM)}</dd>
          </div>
        )}
        {answer.faultOhm !== undefined && (
          <div>
            <dt className="text-ink-soft">The fault’s own resistance</dt>
            <dd className="font-medium">{answer.faultOhm < 0 ? '≈ 0 Ω (dead short)' : formatOhm(answer.faultOhm)}</dd>
          </div>
        )}
        {answer.velocityFactor !== undefined && (
          <div>
            <dt className="text-ink-soft">Velocity factor</dt>
            <dd className="font-medium">{Number(answer.velocityFactor.toPrecision(3))}</dd>
          </div>
        )}
      </dl>
      {!compact && (
        <CableDrawing distanceM={answer.distanceM} uncertaintyM={answer.uncertaintyM} lengthM={cableLengthM} unitSystem={unitSystem} />
      )}
      {!(compact && source === 'server') && <p className="text-sm leading-relaxed text-ink">{answer.explanation}</p>}
    </section>
  );
}
