import { useEffect, useId, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { Button } from './button';

export type TraceMarkerId = 'incident' | 'reflection';
/** Marker positions in seconds. */
export type TraceMarkerTimes = Record<TraceMarkerId, number>;

const IDS = ['incident', 'reflection'] as const;

// Canvas cannot read the CSS theme tokens: --color-brand, --color-fail, --color-ink-soft, --color-line.
const TRACE = '#0f3d3e';
const COLORS: Record<TraceMarkerId, string> = { incident: '#0f3d3e', reflection: '#b3261e' };
/** Dashed as well as coloured, so the two markers are told apart without colour. */
const DASH: Record<TraceMarkerId, number[]> = { incident: [], reflection: [8, 5] };
const AXIS = '#4a5a63';
const GRID = '#e7e3da';
const GRAB_PX = 18;
const DEFAULT_LABELS: Record<TraceMarkerId, string> = { incident: 'Incident edge', reflection: 'Reflection' };

export const formatNs = (s: number) => `${(s * 1e9).toFixed(2)} ns`;

export interface TraceChartProps {
  /** Seconds, ascending; plotted in ns. */
  timeS: number[];
  volts: number[];
  markers: TraceMarkerTimes;
  /** Called with the new positions, already kept inside the trace. */
  onMarkersChange: (markers: TraceMarkerTimes) => void;
  /** One sample interval in seconds: the step of the nudge buttons and the arrow keys. */
  stepS: number;
  /** Text alternative for the canvas. */
  label: string;
  markerLabels?: Partial<Record<TraceMarkerId, string>>;
  /** The marker that taps and the arrow keys move at first. */
  initialActive?: TraceMarkerId;
  /** Open zoomed to the span between the markers rather than on the whole trace. */
  startZoomed?: boolean;
  height?: number;
  /** Shown under the plot, after the hint on how to move the markers. */
  footnote?: ReactNode;
}

/**
 * A trace (volts over time) with two vertical markers the user can move: drag one, tap where the
 * chosen one belongs, or nudge it by one or ten samples with the buttons or the arrow keys (Shift
 * for ten). Zoom to the markers and back with the buttons. The plot follows its container's width.
 */
export function TraceChart({
  timeS,
  volts,
  markers,
  onMarkersChange,
  stepS,
  label,
  markerLabels,
  initialActive = 'incident',
  startZoomed = false,
  height = 300,
  footnote,
}: TraceChartProps) {
  const labels = { ...DEFAULT_LABELS, ...markerLabels };
  const radioName = useId();
  const ref = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const [active, setActive] = useState<TraceMarkerId>(initialActive);
  const [zoomed, setZoomed] = useState(startZoomed);
  const first = timeS[0] ?? 0;
  const last = timeS[timeS.length - 1] ?? 0;
  const clamp = (t: number) => Math.min(last, Math.max(first, t));

  const move = (which: TraceMarkerId, t: number) => onMarkersChange({ ...markers, [which]: clamp(t) });
  const nudge = (which: TraceMarkerId, samples: number) => move(which, markers[which] + samples * stepS);

  // The uPlot instance lives across renders; its hooks read the latest props from here.
  const state = useRef({ markers, active, labels, move, setActive, startZoomed });
  state.current = { markers, active, labels, move, setActive, startZoomed };

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const markerPlugin: uPlot.Plugin = {
      hooks: {
        draw: (u) => {
          const ctx = u.ctx;
          const { top, height: h } = u.bbox;
          const dpr = devicePixelRatio;
          ctx.save();
          ctx.font = `${Math.round(12 * dpr)}px sans-serif`;
          for (const which of IDS) {
            const x = u.valToPos(state.current.markers[which] * 1e9, 'x', true);
            ctx.strokeStyle = COLORS[which];
            ctx.fillStyle = COLORS[which];
            ctx.lineWidth = (state.current.active === which ? 3 : 2) * dpr;
            ctx.setLineDash(DASH[which].map((d) => d * dpr));
            ctx.beginPath();
            ctx.moveTo(x, top);
            ctx.lineTo(x, top + h);
            ctx.stroke();
            // A handle at the top, wide enough to grab with a finger.
            ctx.setLineDash([]);
            ctx.beginPath();
            ctx.arc(x, top + 10 * dpr, 7 * dpr, 0, Math.PI * 2);
            ctx.fill();
            // Labels at different heights, so they do not collide when the markers are close.
            const text = state.current.labels[which];
            const w = ctx.measureText(text).width;
            const gap = 6 * dpr;
            const right = x + gap + w < u.bbox.left + u.bbox.width;
            ctx.fillText(text, right ? x + gap : x - gap - w, top + (which === 'incident' ? 36 : 54) * dpr);
          }
          ctx.restore();
        },
      },
    };
    const opts: uPlot.Options = {
      width: el.clientWidth || 600,
      height,
      scales: { x: { time: false } },
      legend: { show: false },
      // Dragging moves markers, so no drag-to-zoom.
      cursor: { drag: { x: false, y: false }, points: { show: false } },
      series: [{}, { stroke: TRACE, width: 1.5, points: { show: false } }],
      axes: [
        { label: 'time (ns)', stroke: AXIS, grid: { stroke: GRID } },
        { label: 'volts', stroke: AXIS, grid: { stroke: GRID }, size: 56 },
      ],
      plugins: [markerPlugin],
      hooks: { ready: [(u) => state.current.startZoomed && zoomTo(u, state.current.markers, first, last)] },
    };
    const plot = new uPlot(opts, [timeS.map((t) => t * 1e9), volts], el);
    plotRef.current = plot;

    const over = plot.over;
    over.style.touchAction = 'none';
    let dragging: TraceMarkerId | null = null;
    const timeAt = (e: PointerEvent) => plot.posToVal(e.clientX - over.getBoundingClientRect().left, 'x') * 1e-9;
    const down = (e: PointerEvent) => {
      const x = e.clientX - over.getBoundingClientRect().left;
      const near = IDS.map((w) => ({ w, d: Math.abs(plot.valToPos(state.current.markers[w] * 1e9, 'x') - x) })).sort(
        (a, b) => a.d - b.d,
      )[0]!;
      dragging = near.d <= GRAB_PX ? near.w : state.current.active;
      state.current.setActive(dragging);
      over.setPointerCapture(e.pointerId);
      state.current.move(dragging, timeAt(e));
      e.preventDefault();
    };
    const drag = (e: PointerEvent) => {
      if (dragging) state.current.move(dragging, timeAt(e));
    };
    const up = (e: PointerEvent) => {
      dragging = null;
      if (over.hasPointerCapture(e.pointerId)) over.releasePointerCapture(e.pointerId);
    };
    over.addEventListener('pointerdown', down);
    over.addEventListener('pointermove', drag);
    over.addEventListener('pointerup', up);
    over.addEventListener('pointercancel', up);

    const observer = new ResizeObserver((entries) => {
      const w = entries[0]?.contentRect.width;
      if (w) plot.setSize({ width: Math.round(w), height });
    });
    observer.observe(el);
    return () => {
      observer.disconnect();
      plot.destroy();
      plotRef.current = null;
    };
  }, [timeS, volts, height, first, last]);

  // Markers and the active one are drawn from the ref: a redraw, not a new plot.
  useEffect(() => {
    plotRef.current?.redraw(false);
  }, [markers, active]);

  function onKeyDown(e: KeyboardEvent) {
    if (e.key !== 'ArrowLeft' && e.key !== 'ArrowRight') return;
    e.preventDefault();
    nudge(active, (e.key === 'ArrowLeft' ? -1 : 1) * (e.shiftKey ? 10 : 1));
  }
  function zoomToMarkers() {
    if (!plotRef.current) return;
    zoomTo(plotRef.current, markers, first, last);
    setZoomed(true);
  }
  function wholeTrace() {
    plotRef.current?.setScale('x', { min: first * 1e9, max: last * 1e9 });
    setZoomed(false);
  }

  return (
    <div className="flex flex-col gap-3">
      <div
        ref={ref}
        role="img"
        tabIndex={0}
        aria-label={label}
        onKeyDown={onKeyDown}
        className="w-full min-w-0 overflow-hidden rounded-lg border border-line bg-card outline-none [contain:inline-size] focus-visible:ring-2 focus-visible:ring-brand"
        data-testid="trace-plot"
      />
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="ghost" onClick={zoomToMarkers}>
          Zoom to the markers
        </Button>
        <Button variant="ghost" onClick={wholeTrace} disabled={!zoomed}>
          Whole trace
        </Button>
      </div>
      <p className="text-xs text-ink-soft">
        Drag a marker, or choose one below and tap the trace where it belongs. Arrow keys move the chosen marker by one sample (with Shift,
        ten).{footnote ? <> {footnote}</> : null}
      </p>

      <div className="grid gap-3 md:grid-cols-2">
        {IDS.map((which) => (
          <fieldset
            key={which}
            className={`rounded-lg border p-3 ${active === which ? 'border-brand bg-brand-soft' : 'border-line'}`}
            data-testid={`marker-${which}`}
          >
            <legend className="px-1 text-sm font-medium">
              <label className="inline-flex min-h-touch cursor-pointer items-center gap-2">
                <input type="radio" name={radioName} checked={active === which} onChange={() => setActive(which)} className="size-5" />
                <span
                  aria-hidden
                  className="inline-block w-6 border-t-2"
                  style={{ borderColor: COLORS[which], borderStyle: DASH[which].length > 0 ? 'dashed' : 'solid' }}
                />
                {labels[which]}
              </label>
            </legend>
            <p className="text-lg font-semibold tabular-nums" data-testid={`marker-${which}-time`}>
              {formatNs(markers[which])}
            </p>
            <div className="mt-2 flex flex-wrap gap-2">
              {(
                [
                  [-10, '10 samples earlier', '◀◀'],
                  [-1, 'one sample earlier', '◀'],
                  [1, 'one sample later', '▶'],
                  [10, '10 samples later', '▶▶'],
                ] as const
              ).map(([samples, words, arrows]) => (
                <Button key={samples} variant="secondary" aria-label={`${labels[which]}: ${words}`} onClick={() => nudge(which, samples)}>
                  {arrows}
                </Button>
              ))}
            </div>
          </fieldset>
        ))}
      </div>
    </div>
  );
}

/** The span between the markers with a margin either side, inside the trace. */
function zoomTo(plot: uPlot, markers: TraceMarkerTimes, first: number, last: number) {
  const a = Math.min(markers.incident, markers.reflection);
  const b = Math.max(markers.incident, markers.reflection);
  const pad = Math.max((b - a) * 0.25, 2e-9);
  plot.setScale('x', { min: Math.max(first, a - pad) * 1e9, max: Math.min(last, b + pad) * 1e9 });
}
