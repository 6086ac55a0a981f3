import { useMemo, useState } from 'react';
import { formatLength, type LengthSystem } from '@shared/domain/units';
import { estimateFromMarkers, WaveformError, type MarkerEstimate } from '@shared/domain/waveform';
import { WAVEFORM_MAX_BYTES } from '@shared/schemas/waveforms';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';
import { formatNs, TraceChart, type TraceMarkerTimes } from '@/components/ui/trace-chart';
import { useAnalyseWaveform, type WaveformAnswer } from '../api/analyse-waveform';
import { parseLength, parseVelocityFactor, pinLengthUnit } from '../utils/parse-inputs';

export interface TdrReading {
  roundTripNs: number;
  riseTimeNs: number;
  velocityFactor?: number | undefined;
}

/**
 * Upload a scope trace (CSV), see it plotted with the incident edge and the reflection marked,
 * and the round trip, polarity and (with a velocity factor) the distance. The markers can be moved
 * by hand; the numbers follow, and the round trip handed to the TDR method is the moved one.
 */
export function WaveformSection({
  unitSystem,
  velocityFactorText,
  onVelocityFactorText,
  onUse,
}: {
  unitSystem: LengthSystem;
  velocityFactorText: string;
  onVelocityFactorText: (text: string) => void;
  onUse?: (reading: TdrReading) => void;
}) {
  const [file, setFile] = useState<File | null>(null);
  const [lengthText, setLengthText] = useState('');
  const [localError, setLocalError] = useState<string | null>(null);
  const [seenSystem, setSeenSystem] = useState(unitSystem);
  if (seenSystem !== unitSystem) {
    setSeenSystem(unitSystem);
    setLengthText(pinLengthUnit(lengthText, seenSystem));
  }
  const analyse = useAnalyseWaveform();

  const vf = velocityFactorText.trim() ? parseVelocityFactor(velocityFactorText) : null;
  const length = lengthText.trim() ? parseLength(lengthText, unitSystem) : null;

  const submit = () => {
    setLocalError(null);
    if (!file) return setLocalError('Choose a trace file first (CSV: time in seconds, volts).');
    if (file.size > WAVEFORM_MAX_BYTES) {
      return setLocalError(
        `This file is ${(file.size / 2 ** 20).toFixed(0)} MB; at most ${WAVEFORM_MAX_BYTES / 2 ** 20} MB is accepted. Export a shorter window.`,
      );
    }
    if (vf && !vf.ok) return;
    if (length && !length.ok) return;
    analyse.mutate({ file, velocityFactor: vf?.ok ? vf.value : undefined, lengthM: length?.ok ? length.value : undefined });
  };

  return (
    <div className="flex flex-col gap-4">
      <form
        noValidate
        aria-label="Trace upload"
        className="grid grid-cols-1 gap-4 sm:grid-cols-2 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)_auto] lg:items-end"
        onSubmit={(e) => {
          e.preventDefault();
          submit();
        }}
      >
        <div className="flex flex-col gap-1">
          <label htmlFor="trace-file" className="text-sm font-medium text-ink">
            Trace file (CSV from the scope)
          </label>
          <input
            id="trace-file"
            type="file"
            accept=".csv,.txt,text/csv,text/plain"
            className="min-h-touch w-full rounded-lg border border-line bg-card px-3 py-2 text-sm file:mr-3 file:rounded-md file:border-0 file:bg-brand-soft file:px-3 file:py-1.5 file:font-medium file:text-brand"
            onChange={(e) => setFile(e.target.files?.[0] ?? null)}
          />
        </div>
        <TextField
          id="trace-velocityFactor"
          label="Velocity factor (optional)"
          value={velocityFactorText}
          onChange={(e) => onVelocityFactorText(e.target.value)}
          inputMode="decimal"
          autoComplete="off"
          placeholder="e.g. 0.66"
          error={vf && !vf.ok ? vf.message : undefined}
        />
        <TextField
          id="trace-lengthM"
          label={`Cable length (optional, ${unitSystem === 'imperial' ? 'ft' : 'm'})`}
          value={lengthText}
          onChange={(e) => setLengthText(e.target.value)}
          inputMode="decimal"
          autoComplete="off"
          placeholder="e.g. 12"
          error={length && !length.ok ? length.message : undefined}
        />
        <Button type="submit" disabled={analyse.isPending}>
          {analyse.isPending ? 'Analysing…' : 'Analyse trace'}
        </Button>
      </form>
      {localError && <Notice tone="error">{localError}</Notice>}
      {analyse.isError && <Notice tone="error">{analyse.error.message}</Notice>}
      {analyse.data && !analyse.isPending && (
        <WaveformResult
          key={analyse.submittedAt}
          data={analyse.data}
          unitSystem={unitSystem}
          velocityFactor={vf?.ok ? vf.value : undefined}
          lengthM={length?.ok ? length.value : undefined}
          onUse={onUse}
        />
      )}
    </div>
  );
}

function WaveformResult({
  data,
  unitSystem,
  velocityFactor,
  lengthM,
  onUse,
}: {
  data: WaveformAnswer;
  unitSystem: LengthSystem;
  velocityFactor: number | undefined;
  lengthM: number | undefined;
  onUse?: ((reading: TdrReading) => void) | undefined;
}) {
  const { incident, reflection } = data.markers;
  const first = data.plot.timeS[0] ?? 0;
  const last = data.plot.timeS[data.plot.timeS.length - 1] ?? 0;
  // Without a reflection found, the second marker waits at 60 % of the trace for the technician.
  const automatic = useMemo<TraceMarkerTimes>(
    () => ({ incident: incident.timeS, reflection: reflection?.timeS ?? first + (last - first) * 0.6 }),
    [incident.timeS, reflection, first, last],
  );
  const [markers, setMarkers] = useState<TraceMarkerTimes>(automatic);
  const moved = markers.incident !== automatic.incident || markers.reflection !== automatic.reflection;
  const trace = useMemo(() => ({ timeS: Float64Array.from(data.plot.timeS), volts: Float64Array.from(data.plot.volts) }), [data.plot]);
  // Recomputed here with the shared engine, so a moved marker moves the estimate at once.
  const estimate = useMemo<MarkerEstimate | { error: string }>(() => {
    try {
      return estimateFromMarkers(trace, markers.incident, markers.reflection, {
        velocityFactor,
        lengthM,
        riseTimeNs: data.riseTimeNs,
        units: unitSystem,
      });
    } catch (err) {
      if (err instanceof WaveformError) return { error: err.message };
      throw err;
    }
  }, [trace, markers, velocityFactor, lengthM, data.riseTimeNs, unitSystem]);
  const ok = 'roundTripNs' in estimate ? estimate : null;
  // Until a marker moves, the numbers are the server's, measured on every sample rather than the plotted ones.
  const shown =
    moved || !ok
      ? ok
      : { ...ok, polarity: data.polarity ?? ok.polarity, reflectionCoefficient: data.reflectionCoefficient ?? ok.reflectionCoefficient };
  const found = reflection !== null || moved;
  const rho = found ? shown?.reflectionCoefficient : null;
  const ns = (v: number) => `${v.toFixed(2)} ns`;
  return (
    <div className="flex flex-col gap-4">
      {!reflection && (
        <Notice tone="caution">
          No reflection was found automatically. Place the reflection marker by hand where the trace steps again.
        </Notice>
      )}
      <TraceChart
        timeS={data.plot.timeS}
        volts={data.plot.volts}
        markers={markers}
        onMarkersChange={setMarkers}
        stepS={data.sampleIntervalNs * 1e-9}
        initialActive={reflection ? 'incident' : 'reflection'}
        startZoomed={reflection !== null}
        label={`Trace of ${data.sampleCount.toLocaleString('en')} samples with the incident edge at ${formatNs(markers.incident)}${found ? ` and the reflection at ${formatNs(markers.reflection)}` : ', no reflection found'}.`}
      />
      <dl className="grid grid-cols-2 gap-x-6 gap-y-2 text-sm sm:grid-cols-3 lg:grid-cols-6" aria-live="polite">
        <Stat label="Round trip Δt" testId="trace-round-trip" value={shown && found ? ns(shown.roundTripNs) : '—'} />
        <Stat
          label="Polarity"
          testId="trace-polarity"
          value={!shown?.polarity || !found ? '—' : shown.polarity === 'open' ? '↑ open (steps up)' : '↓ short (steps down)'}
        />
        <Stat label="Reflection coefficient" value={rho == null ? '—' : `${rho >= 0 ? '+' : ''}${rho.toFixed(2)}`} />
        <Stat label="Rise time (10–90 %)" value={ns(data.riseTimeNs)} />
        <Stat label="Sample interval" value={ns(data.sampleIntervalNs)} />
        <Stat
          label="Distance"
          testId="trace-distance"
          value={
            shown?.distanceM != null && found
              ? `${formatLength(shown.distanceM, unitSystem)} ±${formatLength(shown.uncertaintyM ?? 0, unitSystem)}`
              : velocityFactor === undefined
                ? 'needs a velocity factor'
                : '—'
          }
        />
      </dl>
      <p className="text-xs text-ink-soft" data-testid="trace-markers">
        Incident edge at {formatNs(markers.incident)}
        {found ? `, reflection at ${formatNs(markers.reflection)}` : ''} · {data.sampleCount.toLocaleString('en')} samples
        {moved ? ' · placed by hand' : ' · found automatically'}
      </p>
      {'error' in estimate && <Notice tone="error">{estimate.error}</Notice>}
      <p className="text-sm leading-relaxed">{moved || !ok ? (ok?.message ?? '') : data.message}</p>
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={() => setMarkers(automatic)} disabled={!moved}>
          Back to the automatic markers
        </Button>
        {onUse && shown && found && shown.roundTripNs > 0 && (
          <Button
            variant="secondary"
            onClick={() =>
              onUse({
                roundTripNs: shown.roundTripNs,
                riseTimeNs: data.riseTimeNs,
                velocityFactor: velocityFactor ?? data.estimate?.velocityFactor,
              })
            }
          >
            Use this round trip in the TDR method
          </Button>
        )}
      </div>
    </div>
  );
}

function Stat({ label, value, testId }: { label: string; value: string; testId?: string }) {
  return (
    <div>
      <dt className="text-ink-soft">{label}</dt>
      <dd className="font-medium" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}
