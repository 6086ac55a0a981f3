import { useLayoutEffect, useRef, useState, type RefObject } from 'react';
import { formatLength, METRES_PER_FOOT, type LengthSystem } from '@shared/domain/units';

export interface CablePoint {
  /** From the near end, in metres. */
  distanceM: number;
  /** ± half-width of the band around it, in metres. */
  uncertaintyM: number;
}

export interface CableDrawingProps {
  /** Distance of the marked point from the near end, in metres; without it only the cable is drawn. */
  distanceM?: number | undefined;
  /** ± half-width of the band around it, in metres. */
  uncertaintyM?: number | undefined;
  /** Further points drawn in grey under the marked one (e.g. the single readings behind it). */
  others?: readonly CablePoint[] | undefined;
  /** Whole cable; when unknown the far end is drawn open-ended past the band. */
  lengthM?: number | undefined;
  unitSystem: LengthSystem;
  nearLabel?: string;
  farLabel?: string;
  markerLabel?: string;
  className?: string;
}

const HEIGHT = 150;
const PAD_X = 24;
const CABLE_Y = 70;
const INK = 'var(--color-ink)';
const SOFT = 'var(--color-ink-soft)';

/**
 * A cable drawn to scale: both ends labelled, a point on it with its ± band, and a scale with
 * ticks in metres or feet. Pixel coordinates follow the container's width so text stays legible
 * on a phone as on a tablet.
 */
export function CableDrawing({
  distanceM,
  uncertaintyM,
  lengthM,
  unitSystem,
  nearLabel = 'near end (where you measure)',
  farLabel = 'far end',
  markerLabel = 'fault',
  others = [],
  className = '',
}: CableDrawingProps) {
  const [ref, width] = useElementWidth<HTMLDivElement>();
  const known = lengthM !== undefined && lengthM > 0;
  const marked = distanceM !== undefined;
  const points = [...others, ...(marked ? [{ distanceM, uncertaintyM: uncertaintyM ?? 0 }] : [])];
  const bandLo = Math.min(0, ...points.map((p) => p.distanceM - p.uncertaintyM));
  const bandHi = Math.max(0, ...points.map((p) => p.distanceM + p.uncertaintyM));
  const farthest = Math.max(0, ...points.map((p) => p.distanceM));
  const domainMin = bandLo;
  const domainMax = known ? Math.max(lengthM, bandHi) : Math.max(bandHi * 1.25, farthest + 1);
  const span = domainMax - domainMin || 1;
  const inner = Math.max(width - 2 * PAD_X, 10);
  const x = (m: number) => PAD_X + ((m - domainMin) / span) * inner;
  const cableEnd = known ? x(lengthM) : width - PAD_X;

  const unitLength = unitSystem === 'imperial' ? METRES_PER_FOOT : 1;
  const unit = unitSystem === 'imperial' ? 'ft' : 'm';
  const targetTicks = Math.max(2, Math.floor(inner / 70));
  const step = niceStep(span / unitLength / targetTicks);
  const ticks: number[] = [];
  for (let v = Math.ceil(domainMin / unitLength / step) * step; v <= domainMax / unitLength + 1e-9; v += step) ticks.push(v);

  const fx = marked ? x(distanceM) : 0;
  const bx0 = marked ? Math.max(x(distanceM - (uncertaintyM ?? 0)), PAD_X) : 0;
  const bx1 = marked ? Math.min(x(distanceM + (uncertaintyM ?? 0)), width - PAD_X) : 0;
  const anchor = fx < 90 ? 'start' : fx > width - 90 ? 'end' : 'middle';
  const cable = `Cable ${known ? formatLength(lengthM, unitSystem) + ' long' : 'of unknown length'}`;
  const description = marked
    ? `${cable}: ${markerLabel} about ${formatLength(distanceM, unitSystem)} from the ${nearLabel}, ±${formatLength(uncertaintyM ?? 0, unitSystem)}` +
      (known ? `, ${formatLength(lengthM - distanceM, unitSystem)} from the ${farLabel}` : '') +
      (others.length > 0 ? `; ${others.length} further points shown in grey.` : '.')
    : `${cable}, no ${markerLabel} marked yet.`;

  return (
    // inline-size containment: the drawing takes the width it is given and never widens its parent.
    <div ref={ref} className={`w-full min-w-0 overflow-hidden [contain:inline-size] ${className}`}>
      <svg width={width} height={HEIGHT} role="img" aria-label={description} className="block overflow-visible">
        <text x={PAD_X} y={16} fontSize={13} fill={SOFT}>
          {nearLabel}
        </text>
        <text x={cableEnd} y={16} fontSize={13} fill={SOFT} textAnchor="end">
          {known ? farLabel : `${farLabel} (length not given)`}
        </text>

        {/* The band first, so the cable and the marker sit on top of it. */}
        {marked && (
          <rect
            data-testid="cable-band"
            x={bx0}
            y={CABLE_Y - 18}
            width={Math.max(bx1 - bx0, 2)}
            height={36}
            rx={4}
            fill="var(--color-brass-soft)"
            stroke="var(--color-brass)"
            strokeDasharray="4 3"
          />
        )}
        <line
          x1={x(0)}
          x2={cableEnd}
          y1={CABLE_Y}
          y2={CABLE_Y}
          stroke="var(--color-brand)"
          strokeWidth={6}
          strokeLinecap="round"
          strokeDasharray={known ? undefined : '14 6'}
        />
        <rect x={x(0) - 6} y={CABLE_Y - 12} width={12} height={24} rx={2} fill={INK} />
        {known && <rect x={cableEnd - 6} y={CABLE_Y - 12} width={12} height={24} rx={2} fill={INK} />}

        {others.map((p, i) => (
          <g key={i} data-testid="cable-other-point" data-distance-m={p.distanceM}>
            <line x1={x(p.distanceM)} x2={x(p.distanceM)} y1={CABLE_Y - 22} y2={CABLE_Y + 26} stroke={SOFT} strokeWidth={2} />
            <circle cx={x(p.distanceM)} cy={CABLE_Y + 26} r={4} fill={SOFT} />
          </g>
        ))}

        {marked && (
          <g data-testid="fault-marker" data-distance-m={distanceM}>
            <line x1={fx} x2={fx} y1={CABLE_Y - 26} y2={CABLE_Y + 22} stroke="var(--color-fail)" strokeWidth={2.5} />
            {/* A cross as well as a colour, so the spot reads without colour vision. */}
            <path
              d={`M${fx - 7} ${CABLE_Y - 7} L${fx + 7} ${CABLE_Y + 7} M${fx + 7} ${CABLE_Y - 7} L${fx - 7} ${CABLE_Y + 7}`}
              stroke="var(--color-fail)"
              strokeWidth={3}
              strokeLinecap="round"
            />
            <text x={fx} y={CABLE_Y - 32} fontSize={14} fontWeight={600} fill={INK} textAnchor={anchor}>
              {markerLabel} ≈ {formatLength(distanceM, unitSystem)}
            </text>
          </g>
        )}

        <g aria-hidden="true">
          <line x1={PAD_X} x2={width - PAD_X} y1={HEIGHT - 34} y2={HEIGHT - 34} stroke={SOFT} />
          {ticks.map((v) => {
            const tx = x(v * unitLength);
            return (
              <g key={v}>
                <line x1={tx} x2={tx} y1={HEIGHT - 40} y2={HEIGHT - 28} stroke={SOFT} />
                <text x={tx} y={HEIGHT - 12} fontSize={12} fill={SOFT} textAnchor="middle">
                  {formatTick(v)} {unit}
                </text>
              </g>
            );
          })}
        </g>
      </svg>
    </div>
  );
}

/** 1, 2 or 5 × 10ⁿ: the steps a ruler uses. */
function niceStep(raw: number): number {
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  const power = 10 ** Math.floor(Math.log10(raw));
  const f = raw / power;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * power;
}

function formatTick(v: number): string {
  const rounded = Number(v.toPrecision(6));
  return rounded === 0 ? '0' : String(rounded);
}

function useElementWidth<T extends HTMLElement>(fallback = 640): [RefObject<T | null>, number] {
  const ref = useRef<T>(null);
  const [width, setWidth] = useState(fallback);
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    setWidth(el.clientWidth || fallback);
    const observer = new ResizeObserver((entries) => {
      const w = entries[0]?.contentRect.width;
      if (w) setWidth(Math.round(w));
    });
    observer.observe(el);
    return () => observer.disconnect();
  }, [fallback]);
  return [ref, width];
}
