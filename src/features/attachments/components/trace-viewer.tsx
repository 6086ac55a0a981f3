import { useEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { estimateFromMarkers, WaveformError, type MarkerEstimate } from '@shared/domain/waveform';
import { formatLength, type LengthSystem } from '@shared/domain/units';
import type { TraceAnalysisDto } from '@shared/schemas/attachments';
import { Button } from '@/components/ui/button';
import { Loading, Notice } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';
import { MarkIcon } from '@/components/ui/status-mark';
import { useTraceAnalysis } from '../api/get-trace-analysis';
import { useSaveTraceEstimate } from '../api/save-trace-estimate';

type Which = 'incident' | 'reflection';
type Markers = { incident: number; reflection: number };

// Canvas cannot read the CSS theme tokens: --color-brand, --color-fail, --color-brass, --color-ink-soft.
const TRACE = '#0f3d3e';
const COLORS: Record<Which, string> = { incident: '#0f3d3e', reflection: '#b3261e' };
const DASH: Record<Which, number[]> = { incident: [], reflection: [8, 5] };
const LABEL: Record<Which, string> = { incident: 'Incident edge', reflection: 'Reflection' };
const AXIS = '#4a5a63';
const GRAB_PX = 18;

const ns = (s: number) => `${(s * 1e9).toFixed(2)} ns`;

/**
 * A stored scope trace, plotted, with the incident edge and the reflection marked. The technician
 * can move either marker (drag it, tap where it belongs, or nudge it sample by sample with the
 * buttons or the arrow keys); the round trip and the distance follow, computed here with the
 * shared engine, and the estimate can be saved on the fault.
 */
export function TraceViewer({
  attachmentId,
  faultId,
  canSave,
  unitSystem,
  onSaved,
}: {
  attachmentId: string;
  faultId?: string | undefined;
  canSave: boolean;
  unitSystem: LengthSystem;
  onSaved?: () => void;
}) {
  const analysis = useTraceAnalysis(attachmentId);
  if (analysis.isPending) return <Loading label="Reading the trace…" />;
  if (analysis.isError) return <Notice tone="error">{analysis.error.message}</Notice>;
  return <TraceWorkbench key={attachmentId} data={analysis.data} faultId={faultId} canSave={canSave} unitSystem={unitSystem} onSaved={onSaved} />;
}

function TraceWorkbench({
  data,
  faultId,
  canSave,
  unitSystem,
  onSaved,
}: {
  data: TraceAnalysisDto;
  faultId?: string | undefined;
  canSave: boolean;
  unitSystem: LengthSystem;
  onSaved?: (() => void) | undefined;
}) {
  const { points, analysis } = data;
  const trace = useMemo(() => ({ timeS: Float64Array.from(points.timeS), volts: Float64Array.from(points.volts) }), [points]);
  const first = points.timeS[0] ?? 0;
  const last = points.timeS[points.timeS.length - 1] ?? 0;
  const stepS = analysis ? analysis.sampleIntervalNs * 1e-9 : (last - first) / Math.max(1, data.sampleCount - 1);
  const automatic: Markers = useMemo(
    () => ({
      incident: analysis?.incidentTimeS ?? first + (last - first) * 0.2,
      reflection: analysis?.reflectionTimeS ?? first + (last - first) * 0.6,
    }),
    [analysis, first, last],
  );
  const [markers, setMarkers] = useState<Markers>(automatic);
  const [active, setActive] = useState<Which>(analysis?.reflectionTimeS == null ? 'reflection' : 'incident');
  const [vfText, setVfText] = useState(data.velocityFactor?.toString() ?? '');
  const vf = Number(vfText.replace(',', '.'));
  const vfValid = vfText.trim() !== '' && Number.isFinite(vf) && vf > 0 && vf <= 1;
  const moved = markers.incident !== automatic.incident || markers.reflection !== automatic.reflection;
  const save = useSaveTraceEstimate(faultId ?? '', onSaved);

  const estimate: MarkerEstimate | { error: string } = useMemo(() => {
    try {
      return estimateFromMarkers(trace, markers.incident, markers.reflection, {
        velocityFactor: vfValid ? vf : undefined,
        lengthM: data.lengthM ?? undefined,
        riseTimeNs: analysis?.riseTimeNs,
      });
    } catch (err) {
      if (err instanceof WaveformError) return { error: err.message };
      throw err;
    }
  }, [trace, markers, vf, vfValid, data.lengthM, analysis?.riseTimeNs]);

  const clamp = (t: number) => Math.min(last, Math.max(first, t));
  const nudge = (which: Which, samples: number) => setMarkers((m) => ({ ...m, [which]: clamp(m[which] + samples * stepS) }));

  function onKey(e: KeyboardEvent) {
    if (e.key !== 'ArrowLeft' && e.key !== 'ArrowRight') return;
    e.preventDefault();
    nudge(active, (e.key === 'ArrowLeft' ? -1 : 1) * (e.shiftKey ? 10 : 1));
  }

  const ok = 'roundTripNs' in estimate ? estimate : null;
  const distance =
    ok?.distanceM != null
      ? `${formatLength(ok.distanceM, unitSystem)}${ok.uncertaintyM != null ? ` ± ${formatLength(ok.uncertaintyM, unitSystem)}` : ''} from the apparatus end`
      : null;

  return (
    <div className="flex flex-col gap-3">
      {data.problem && (
        <Notice tone="caution">
          The automatic analysis found no edges: {data.problem} Place both markers by hand to measure the round trip.
        </Notice>
      )}
      <MarkerPlot
        timeS={points.timeS}
        volts={points.volts}
        markers={markers}
        active={active}
        onMove={(which, t) => {
          setActive(which);
          setMarkers((m) => ({ ...m, [which]: clamp(t) }));
        }}
        onKeyDown={onKey}
        label={`Scope trace ${data.originalName}: incident edge at ${ns(markers.incident)}, reflection at ${ns(markers.reflection)}`}
      />
      <p className="text-xs text-ink-soft">
        Drag a marker, or choose one below and tap the trace where it belongs. Arrow keys move the chosen marker by one sample
        (with Shift, ten). The plot shows {points.timeS.length.toLocaleString('en')} of {data.sampleCount.toLocaleString('en')} samples.
      </p>

      <div className="grid gap-3 md:grid-cols-2">
        {(['incident', 'reflection'] as const).map((which) => (
          <fieldset
            key={which}
            className={`rounded-lg border p-3 ${active === which ? 'border-brand bg-brand-soft' : 'border-line'}`}
            data-testid={`marker-${which}`}
          >
            <legend className="px-1 text-sm font-medium">
              <label className="inline-flex min-h-touch cursor-pointer items-center gap-2">
                <input type="radio" name="active-marker" checked={active === which} onChange={() => setActive(which)} className="size-5" />
                <span
                  aria-hidden
                  className="inline-block w-6 border-t-2"
                  style={{ borderColor: COLORS[which], borderStyle: which === 'reflection' ? 'dashed' : 'solid' }}
                />
                {LABEL[which]}
              </label>
            </legend>
            <p className="text-lg font-semibold tabular-nums" data-testid={`marker-${which}-time`}>
              {ns(markers[which])}
            </p>
            <div className="mt-2 flex flex-wrap gap-2">
              <Button variant="secondary" aria-label={`${LABEL[which]}: 10 samples earlier`} onClick={() => nudge(which, -10)}>
                ◀◀
              </Button>
              <Button variant="secondary" aria-label={`${LABEL[which]}: one sample earlier`} onClick={() => nudge(which, -1)}>
                ◀
              </Button>
              <Button variant="secondary" aria-label={`${LABEL[which]}: one sample later`} onClick={() => nudge(which, 1)}>
                ▶
              </Button>
              <Button variant="secondary" aria-label={`${LABEL[which]}: 10 samples later`} onClick={() => nudge(which, 10)}>
                ▶▶
              </Button>
            </div>
          </fieldset>
        ))}
      </div>

      <div className="grid items-end gap-3 md:grid-cols-[1fr_14rem]">
        <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-4" aria-live="polite">
          <dt className="text-ink-soft">Round trip Δt</dt>
          <dd className="font-semibold tabular-nums" data-testid="trace-round-trip">
            {ok ? `${ok.roundTripNs.toFixed(2)} ns` : '—'}
          </dd>
          <dt className="text-ink-soft">Polarity</dt>
          <dd className="flex items-center gap-1 font-semibold" data-testid="trace-polarity">
            {ok?.polarity === 'short' && <MarkIcon shape="triangle" tone="fail" />}
            {ok?.polarity === 'open' && <MarkIcon shape="ring" tone="fail" />}
            {ok?.polarity === 'short' ? 'Opposite way: a short' : ok?.polarity === 'open' ? 'Same way: an open' : '—'}
          </dd>
          <dt className="text-ink-soft">Distance</dt>
          <dd className="col-span-3 font-semibold tabular-nums" data-testid="trace-distance">
            {distance ?? (vfValid ? '—' : 'Give the velocity factor')}
          </dd>
        </dl>
        <TextField
          label="Velocity factor"
          name={`vf-${data.attachmentId}`}
          inputMode="decimal"
          value={vfText}
          onChange={(e) => setVfText(e.target.value)}
          error={vfText.trim() !== '' && !vfValid ? 'A number above 0 and at most 1' : undefined}
          hint={data.velocityFactorSource ? `From ${data.velocityFactorSource}` : 'Not in the register: calibrate on a good cable'}
        />
      </div>
      {'error' in estimate && <Notice tone="error">{estimate.error}</Notice>}
      {ok && <p className="text-sm text-ink-soft">{moved ? ok.message : (analysis?.message ?? ok.message)}</p>}

      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={() => setMarkers(automatic)} disabled={!moved}>
          Back to the automatic markers
        </Button>
        {faultId && canSave && (
          <Button
            onClick={() =>
              ok &&
              save.mutate({
                method: 'tdr',
                roundTripNs: Number(ok.roundTripNs.toFixed(3)),
                velocityFactor: vf,
                ...(analysis ? { riseTimeNs: Number(analysis.riseTimeNs.toFixed(3)) } : {}),
                fromEnd: 'near',
              })
            }
            disabled={!ok || !vfValid || ok.roundTripNs <= 0 || save.isPending}
          >
            {save.isPending ? 'Saving…' : 'Save this estimate'}
          </Button>
        )}
      </div>
      {save.isSuccess && <Notice tone="success">Saved with the fault’s estimates.</Notice>}
      {save.isError && <Notice tone="error">{save.error.message}</Notice>}
    </div>
  );
}

/** uPlot with two vertical markers that follow the pointer; zoom with the buttons, not by dragging. */
function MarkerPlot({
  timeS,
  volts,
  markers,
  active,
  onMove,
  onKeyDown,
  label,
}: {
  timeS: number[];
  volts: number[];
  markers: Markers;
  active: Which;
  onMove: (which: Which, timeS: number) => void;
  onKeyDown: (e: KeyboardEvent) => void;
  label: string;
}) {
  const ref = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const state = useRef({ markers, active, onMove });
  state.current = { markers, active, onMove };
  const [zoomed, setZoomed] = useState(false);

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
          for (const which of ['incident', 'reflection'] as const) {
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
            const text = LABEL[which];
            const w = ctx.measureText(text).width;
            const gap = 6 * dpr;
            const right = x + gap + w < u.bbox.left + u.bbox.width;
            ctx.fillText(text, right ? x + gap : x - gap - w, top + 36 * dpr);
          }
          ctx.restore();
        },
      },
    };
    const opts: uPlot.Options = {
      width: el.clientWidth || 600,
      height: 300,
      scales: { x: { time: false } },
      legend: { show: false },
      cursor: { drag: { x: false, y: false }, points: { show: false } },
      series: [{}, { stroke: TRACE, width: 1.5, points: { show: false } }],
      axes: [
        { label: 'time (ns)', stroke: AXIS, grid: { stroke: '#e7e3da' } },
        { label: 'volts', stroke: AXIS, grid: { stroke: '#e7e3da' }, size: 56 },
      ],
      plugins: [markerPlugin],
    };
    const plot = new uPlot(opts, [timeS.map((t) => t * 1e9), volts], el);
    plotRef.current = plot;

    const over = plot.over;
    over.style.touchAction = 'none';
    let dragging: Which | null = null;
    const timeAt = (e: PointerEvent) => plot.posToVal(e.clientX - over.getBoundingClientRect().left, 'x') * 1e-9;
    const down = (e: PointerEvent) => {
      const x = e.clientX - over.getBoundingClientRect().left;
      const near = (['incident', 'reflection'] as const)
        .map((w) => ({ w, d: Math.abs(plot.valToPos(state.current.markers[w] * 1e9, 'x') - x) }))
        .sort((a, b) => a.d - b.d)[0]!;
      dragging = near.d <= GRAB_PX ? near.w : state.current.active;
      over.setPointerCapture(e.pointerId);
      state.current.onMove(dragging, timeAt(e));
      e.preventDefault();
    };
    const move = (e: PointerEvent) => {
      if (dragging) state.current.onMove(dragging, timeAt(e));
    };
    const up = (e: PointerEvent) => {
      dragging = null;
      if (over.hasPointerCapture(e.pointerId)) over.releasePointerCapture(e.pointerId);
    };
    over.addEventListener('pointerdown', down);
    over.addEventListener('pointermove', move);
    over.addEventListener('pointerup', up);
    over.addEventListener('pointercancel', up);

    const observer = new ResizeObserver((entries) => {
      const w = entries[0]?.contentRect.width;
      if (w) plot.setSize({ width: Math.round(w), height: 300 });
    });
    observer.observe(el);
    return () => {
      observer.disconnect();
      plot.destroy();
      plotRef.current = null;
    };
  }, [timeS, volts]);

  // Markers and the active one are drawn from the ref: a redraw, not a new plot.
  useEffect(() => {
    plotRef.current?.redraw(false);
  }, [markers, active]);

  function zoomToMarkers() {
    const plot = plotRef.current;
    if (!plot) return;
    const a = Math.min(markers.incident, markers.reflection);
    const b = Math.max(markers.incident, markers.reflection);
    const pad = Math.max((b - a) * 0.25, 2e-9);
    plot.setScale('x', { min: (a - pad) * 1e9, max: (b + pad) * 1e9 });
    setZoomed(true);
  }
  function wholeTrace() {
    const plot = plotRef.current;
    if (!plot) return;
    plot.setScale('x', { min: timeS[0]! * 1e9, max: timeS[timeS.length - 1]! * 1e9 });
    setZoomed(false);
  }

  return (
    <div className="flex flex-col gap-2">
      <div
        ref={ref}
        role="img"
        tabIndex={0}
        aria-label={label}
        onKeyDown={onKeyDown}
        className="w-full min-w-0 overflow-hidden rounded-lg border border-line bg-card outline-none [contain:inline-size] focus-visible:ring-2 focus-visible:ring-brand"
        data-testid="trace-plot"
      />
      <div className="flex flex-wrap gap-2">
        <Button variant="ghost" onClick={zoomToMarkers}>
          Zoom to the markers
        </Button>
        <Button variant="ghost" onClick={wholeTrace} disabled={!zoomed}>
          Whole trace
        </Button>
      </div>
    </div>
  );
}
