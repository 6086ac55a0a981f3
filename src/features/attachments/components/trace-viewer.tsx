import { useMemo, useState } from 'react';
import { estimateFromMarkers, WaveformError, type MarkerEstimate } from '@shared/domain/waveform';
import { formatLength, type LengthSystem } from '@shared/domain/units';
import type { TraceAnalysisDto } from '@shared/schemas/attachments';
import { Button } from '@/components/ui/button';
import { Loading, Notice } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';
import { MarkIcon } from '@/components/ui/status-mark';
import { formatNs, TraceChart, type TraceMarkerTimes } from '@/components/ui/trace-chart';
import { useTraceAnalysis } from '../api/get-trace-analysis';
import { useSaveTraceEstimate } from '../api/save-trace-estimate';

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
  return (
    <TraceWorkbench key={attachmentId} data={analysis.data} faultId={faultId} canSave={canSave} unitSystem={unitSystem} onSaved={onSaved} />
  );
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
  const automatic: TraceMarkerTimes = useMemo(
    () => ({
      incident: analysis?.incidentTimeS ?? first + (last - first) * 0.2,
      reflection: analysis?.reflectionTimeS ?? first + (last - first) * 0.6,
    }),
    [analysis, first, last],
  );
  const [markers, setMarkers] = useState<TraceMarkerTimes>(automatic);
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
        units: unitSystem,
      });
    } catch (err) {
      if (err instanceof WaveformError) return { error: err.message };
      throw err;
    }
  }, [trace, markers, vf, vfValid, data.lengthM, analysis?.riseTimeNs, unitSystem]);

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
      <TraceChart
        timeS={points.timeS}
        volts={points.volts}
        markers={markers}
        onMarkersChange={setMarkers}
        stepS={stepS}
        initialActive={analysis?.reflectionTimeS == null ? 'reflection' : 'incident'}
        label={`Scope trace ${data.originalName}: incident edge at ${formatNs(markers.incident)}, reflection at ${formatNs(markers.reflection)}`}
        footnote={`The plot shows ${points.timeS.length.toLocaleString('en')} of ${data.sampleCount.toLocaleString('en')} samples.`}
      />

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
