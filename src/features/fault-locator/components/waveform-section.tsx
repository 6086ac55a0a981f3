import { useMemo, useState } from 'react';
import { formatLength, type LengthSystem } from '@shared/domain/units';
import { WAVEFORM_MAX_BYTES } from '@shared/schemas/waveforms';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';
import { useAnalyseWaveform, type WaveformAnswer } from '../api/analyse-waveform';
import { parseLength, parseVelocityFactor, pinLengthUnit } from '../utils/parse-inputs';
import { TracePlot, type TraceMarker } from './trace-plot';

export interface TdrReading {
  roundTripNs: number;
  riseTimeNs: number;
  velocityFactor?: number | undefined;
}

/**
 * Upload a scope trace (CSV), see it plotted with the incident edge and the reflection marked,
 * and the round trip, polarity and (with a velocity factor) the distance.
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
      return setLocalError(`This file is ${(file.size / 2 ** 20).toFixed(0)} MB; at most ${WAVEFORM_MAX_BYTES / 2 ** 20} MB is accepted. Export a shorter window.`);
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
      {analyse.data && !analyse.isPending && <WaveformResult data={analyse.data} unitSystem={unitSystem} onUse={onUse} />}
    </div>
  );
}

function WaveformResult({ data, unitSystem, onUse }: { data: WaveformAnswer; unitSystem: LengthSystem; onUse?: ((reading: TdrReading) => void) | undefined }) {
  const { incident, reflection } = data.markers;
  const markers = useMemo<TraceMarker[]>(
    () => [
      { timeS: incident.timeS, label: 'incident edge' },
      ...(reflection ? [{ timeS: reflection.timeS, label: 'reflection', dash: [6, 4] }] : []),
    ],
    [incident.timeS, reflection],
  );
  const focusS = useMemo<[number, number] | undefined>(() => {
    if (!reflection) return undefined;
    const first = data.plot.timeS[0]!;
    const last = data.plot.timeS[data.plot.timeS.length - 1]!;
    const span = reflection.timeS - incident.timeS;
    const margin = Math.max(span * 0.75, 30 * data.sampleIntervalNs * 1e-9);
    return [Math.max(first, incident.timeS - margin), Math.min(last, reflection.timeS + Math.max(span, margin))];
  }, [data, incident.timeS, reflection]);
  const ns = (v: number) => `${v.toFixed(2)} ns`;
  return (
    <div className="flex flex-col gap-4">
      <TracePlot
        timeS={data.plot.timeS}
        volts={data.plot.volts}
        markers={markers}
        focusS={focusS}
        label={`Trace of ${data.sampleCount.toLocaleString('en')} samples with the incident edge at ${ns(incident.timeS * 1e9)}${reflection ? ` and the reflection at ${ns(reflection.timeS * 1e9)}` : ', no reflection found'}.`}
      />
      <dl className="grid grid-cols-2 gap-x-6 gap-y-2 text-sm sm:grid-cols-3 lg:grid-cols-6">
        <Stat label="Round trip Δt" testId="trace-round-trip" value={data.roundTripNs === null ? '—' : ns(data.roundTripNs)} />
        <Stat
          label="Polarity"
          testId="trace-polarity"
          value={data.polarity === null ? '—' : data.polarity === 'open' ? '▲ open (steps up)' : '▼ short (steps down)'}
        />
        <Stat
          label="Reflection coefficient"
          value={data.reflectionCoefficient === null ? '—' : `${data.reflectionCoefficient >= 0 ? '+' : ''}${data.reflectionCoefficient.toFixed(2)}`}
        />
        <Stat label="Rise time (10–90 %)" value={ns(data.riseTimeNs)} />
        <Stat label="Sample interval" value={ns(data.sampleIntervalNs)} />
        <Stat
          label="Distance"
          testId="trace-distance"
          value={data.distanceM === null ? 'needs a velocity factor' : `${formatLength(data.distanceM, unitSystem)} ±${formatLength(data.uncertaintyM ?? 0, unitSystem)}`}
        />
      </dl>
      <p className="text-xs text-ink-soft" data-testid="trace-markers">
        Incident edge at {ns(incident.timeS * 1e9)}
        {reflection ? `, reflection at ${ns(reflection.timeS * 1e9)}` : ''} · {data.sampleCount.toLocaleString('en')} samples ·
        drag across the plot to zoom, double-click to see the whole trace
      </p>
      <p className="text-sm leading-relaxed">{data.message}</p>
      {onUse && data.roundTripNs !== null && (
        <div>
          <Button
            variant="secondary"
            onClick={() =>
              onUse({
                roundTripNs: data.roundTripNs!,
                riseTimeNs: data.riseTimeNs,
                velocityFactor: data.estimate?.velocityFactor,
              })
            }
          >
            Use this round trip in the TDR method
          </Button>
        </div>
      )}
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
