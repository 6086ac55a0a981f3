import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

export interface TraceMarker {
  timeS: number;
  label: string;
  /** Dashed lines tell markers apart without colour. */
  dash?: number[];
}

export interface TracePlotProps {
  /** Seconds; plotted in ns. */
  timeS: number[];
  volts: number[];
  markers: TraceMarker[];
  height?: number;
  /** Text alternative for the canvas. */
  label: string;
  /** Initial time window in seconds (drag to zoom, double-click shows the whole trace). */
  focusS?: [number, number] | undefined;
}

// Canvas cannot read the CSS theme tokens; these are --color-brand, --color-fail, --color-ink-soft.
const TRACE = '#0f3d3e';
const MARKER = '#b3261e';
const AXIS = '#4a5a63';

/** A scope trace (volts over time) with vertical markers; the plot follows its container's width. */
export function TracePlot({ timeS, volts, markers, height = 280, label, focusS }: TracePlotProps) {
  const ref = useRef<HTMLDivElement>(null);

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const markerPlugin: uPlot.Plugin = {
      hooks: {
        draw: (u) => {
          const ctx = u.ctx;
          const { top, height: h } = u.bbox;
          ctx.save();
          ctx.font = `${Math.round(12 * devicePixelRatio)}px sans-serif`;
          markers.forEach((m, i) => {
            const x = u.valToPos(m.timeS * 1e9, 'x', true);
            ctx.strokeStyle = MARKER;
            ctx.fillStyle = MARKER;
            ctx.lineWidth = 2 * devicePixelRatio;
            ctx.setLineDash((m.dash ?? []).map((d) => d * devicePixelRatio));
            ctx.beginPath();
            ctx.moveTo(x, top);
            ctx.lineTo(x, top + h);
            ctx.stroke();
            // The first label sits left of its line, the others right, so neighbours do not collide.
            const w = ctx.measureText(m.label).width;
            const gap = 6 * devicePixelRatio;
            const fitsLeft = x - gap - w > u.bbox.left;
            const fitsRight = x + gap + w < u.bbox.left + u.bbox.width;
            const left = i === 0 ? fitsLeft || !fitsRight : !fitsRight && fitsLeft;
            ctx.fillText(m.label, left ? x - gap - w : x + gap, top + 16 * devicePixelRatio);
          });
          ctx.restore();
        },
      },
    };
    const opts: uPlot.Options = {
      width: el.clientWidth || 600,
      height,
      scales: { x: { time: false } },
      legend: { show: false },
      cursor: { drag: { x: true, y: false } },
      series: [{}, { stroke: TRACE, width: 1.5, points: { show: false } }],
      axes: [
        { label: 'time (ns)', stroke: AXIS, grid: { stroke: '#e7e3da' } },
        { label: 'volts', stroke: AXIS, grid: { stroke: '#e7e3da' }, size: 56 },
      ],
      plugins: [markerPlugin],
      hooks: focusS ? { ready: [(u) => u.setScale('x', { min: focusS[0] * 1e9, max: focusS[1] * 1e9 })] } : {},
    };
    const plot = new uPlot(opts, [timeS.map((t) => t * 1e9), volts], el);
    const observer = new ResizeObserver((entries) => {
      const w = entries[0]?.contentRect.width;
      if (w) plot.setSize({ width: Math.round(w), height });
    });
    observer.observe(el);
    return () => {
      observer.disconnect();
      plot.destroy();
    };
  }, [timeS, volts, markers, height, focusS]);

  return <div ref={ref} role="img" aria-label={label} className="w-full min-w-0 overflow-hidden [contain:inline-size]" />;
}
