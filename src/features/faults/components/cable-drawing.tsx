import { formatLength, type LengthSystem } from '@shared/domain/units';

interface Marker {
  distanceM: number;
  uncertaintyM: number;
  label: string;
  main?: boolean;
}

function tickStep(lengthM: number) {
  if (lengthM <= 15) return 1;
  if (lengthM <= 40) return 5;
  if (lengthM <= 200) return 10;
  return 10 ** Math.floor(Math.log10(lengthM / 4));
}

/** The cable drawn to scale, apparatus end on the left, with the estimate and its band. */
export function CableDrawing({ lengthM, markers, unitSystem, title }: { lengthM: number; markers: Marker[]; unitSystem: LengthSystem; title: string }) {
  const W = 1000;
  const x0 = 120;
  const x1 = W - 110;
  const span = Math.max(lengthM, ...markers.map((m) => m.distanceM + m.uncertaintyM));
  const x = (d: number) => x0 + (Math.min(Math.max(d, 0), span) / span) * (x1 - x0);
  const step = tickStep(span);
  const ticks = Array.from({ length: Math.floor(span / step) + 1 }, (_, i) => i * step);
  const main = markers.find((m) => m.main) ?? markers[markers.length - 1];
  return (
    <figure className="overflow-x-auto">
      <svg viewBox={`0 0 ${W} 190`} role="img" aria-label={title} className="h-auto w-full min-w-[36rem]">
        <title>{title}</title>
        {/* ends */}
        <rect x={x0 - 44} y={70} width={40} height={30} rx={4} className="fill-brand" />
        <text x={x0 - 24} y={122} textAnchor="middle" className="fill-ink text-[15px] font-semibold">Apparatus end</text>
        <text x={x0 - 24} y={140} textAnchor="middle" className="fill-ink-soft text-[13px]">(near)</text>
        <rect x={x(lengthM) + 4} y={70} width={40} height={30} rx={4} className="fill-brand" />
        <text x={x(lengthM) + 24} y={122} textAnchor="middle" className="fill-ink text-[15px] font-semibold">Far end</text>
        <text x={x(lengthM) + 24} y={140} textAnchor="middle" className="fill-ink-soft text-[13px]">{formatLength(lengthM, unitSystem)}</text>
        {/* band of the main estimate */}
        {main && (
          <rect
            x={x(main.distanceM - main.uncertaintyM)}
            y={58}
            width={Math.max(3, x(main.distanceM + main.uncertaintyM) - x(main.distanceM - main.uncertaintyM))}
            height={54}
            className="fill-fail/20 stroke-fail/60"
            strokeDasharray="4 3"
          />
        )}
        {/* the cable */}
        <rect x={x0} y={80} width={x(lengthM) - x0} height={10} rx={5} className="fill-ink-soft" />
        {ticks.map((t) => (
          <g key={t}>
            <line x1={x(t)} x2={x(t)} y1={94} y2={102} className="stroke-ink-soft" />
            <text x={x(t)} y={176} textAnchor="middle" className="fill-ink-soft text-[12px]">
              {formatLength(t, unitSystem)}
            </text>
          </g>
        ))}
        {markers.filter((m) => m !== main).map((m, i) => (
          <g key={i}>
            <line x1={x(m.distanceM)} x2={x(m.distanceM)} y1={64} y2={106} className="stroke-ink-soft" strokeWidth={2} />
            <circle cx={x(m.distanceM)} cy={64} r={4} className="fill-ink-soft" />
          </g>
        ))}
        {main && (
          <g>
            <line x1={x(main.distanceM)} x2={x(main.distanceM)} y1={40} y2={112} className="stroke-fail" strokeWidth={3} />
            <path d={`M${x(main.distanceM)} 52 l-8 -14 h16 z`} className="fill-fail" />
            <text x={Math.min(Math.max(x(main.distanceM), 180), W - 180)} y={26} textAnchor="middle" className="fill-fail text-[16px] font-semibold">
              {main.label}
            </text>
          </g>
        )}
      </svg>
      {markers.length > 1 && (
        <figcaption className="text-xs text-ink-soft">Red: the estimate used, with its band (dashed). Grey: the single estimates.</figcaption>
      )}
    </figure>
  );
}
