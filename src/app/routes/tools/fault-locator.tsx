import { useState } from 'react';
import { useMe } from '@/features/auth/api/get-me';
import { useLocateFault } from '@/features/fault-locator/api/locate-fault';
import { LocateForm, type LocatorPreset } from '@/features/fault-locator/components/locate-form';
import { VfCalibrationForm } from '@/features/fault-locator/components/vf-calibration-form';
import { WaveformSection } from '@/features/fault-locator/components/waveform-section';
import { Card, Notice, PageHeader } from '@/components/ui/card';

/** Where is the fault? Every method of the trade, the velocity-factor calibration and trace analysis. */
export default function FaultLocatorPage() {
  const me = useMe();
  const unitSystem = me.data?.unitSystem ?? 'metric';
  const [preset, setPreset] = useState<LocatorPreset | undefined>(undefined);
  const [traceVf, setTraceVf] = useState('');
  const locate = useLocateFault();

  const toTdr = (texts: Record<string, string>) => {
    setPreset((p) => ({ id: (p?.id ?? 0) + 1, method: 'tdr', texts }));
    document.getElementById('where-is-the-fault')?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  };

  return (
    <>
      <PageHeader title="Fault locator" subtitle="Estimate how far along a cable the fault is, from the readings you take at its ends." />
      <div className="flex flex-col gap-6">
        <Notice tone="caution">
          <strong>Before you measure:</strong> take these readings only on a cable disconnected at both ends — from the scoring apparatus
          and from mains. Never use a high-voltage insulation tester on anything still connected to electronics (apparatus, reels with their
          boxes): it can destroy them. The hall’s own mains installation is work for a licensed electrician.
        </Notice>

        <Card id="where-is-the-fault" className="scroll-mt-4">
          <h2 className="mb-4 text-lg font-semibold">Where is the fault?</h2>
          <LocateForm
            unitSystem={unitSystem}
            preset={preset}
            submitLabel="Calculate"
            pendingLabel="Checking…"
            recheckOnUnitSwitch
            onSubmit={(request) => locate.mutateAsync({ request, unitSystem })}
          />
        </Card>

        <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,2fr)]">
          <Card>
            <h2 className="text-lg font-semibold">Velocity factor from a good cable</h2>
            <p className="mb-4 mt-1 text-sm text-ink-soft">
              TDR needs the cable’s velocity factor. Measure a good cable of the same type and known length, far end open.
            </p>
            <VfCalibrationForm
              unitSystem={unitSystem}
              onUse={(vf) => {
                toTdr({ velocityFactor: String(vf) });
                setTraceVf(String(vf));
              }}
            />
          </Card>
          <Card>
            <h2 className="text-lg font-semibold">Scope trace</h2>
            <p className="mb-4 mt-1 text-sm text-ink-soft">
              Export the trace as CSV (time in seconds, volts). The incident edge and the first reflection are found and measured between
              their half-way points.
            </p>
            <WaveformSection
              unitSystem={unitSystem}
              velocityFactorText={traceVf}
              onVelocityFactorText={setTraceVf}
              onUse={(r) =>
                toTdr({
                  roundTripNs: r.roundTripNs.toFixed(2),
                  riseTimeNs: r.riseTimeNs.toFixed(2),
                  ...(r.velocityFactor !== undefined ? { velocityFactor: String(r.velocityFactor) } : {}),
                })
              }
            />
          </Card>
        </div>
      </div>
    </>
  );
}
