import { useEffect, useMemo, useState } from 'react';
import { delayNsPerMetre, FaultLocationError, runFaultLocation, type FaultLocationAnswer } from '@shared/domain/fault-location';
import { VF_CALIBRATION_INPUTS } from '@shared/domain/fault-methods';
import { METRES_PER_FOOT, type LengthSystem } from '@shared/domain/units';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';
import { ApiError } from '@/lib/api-client';
import { useLocateFault } from '../api/locate-fault';
import { parseLength, parseQuantity, pinLengthUnit } from '../utils/parse-inputs';

const [ROUND_TRIP, LENGTH] = VF_CALIBRATION_INPUTS;

type Result = {
  request: { method: 'vf-calibration'; lengthM: number; roundTripNs: number } | null;
  answer: FaultLocationAnswer | null;
  errors: Record<string, string>;
};

/**
 * Velocity factor from a good cable of known length: its far-end reflection's round trip.
 * `onUse` hands the result to whatever needs it (the TDR form on the locator page).
 */
export function VfCalibrationForm({ unitSystem, onUse }: { unitSystem: LengthSystem; onUse?: (velocityFactor: number) => void }) {
  const [lengthText, setLengthText] = useState('');
  const [timeText, setTimeText] = useState('');
  const [seenSystem, setSeenSystem] = useState(unitSystem);
  const check = useLocateFault();

  if (seenSystem !== unitSystem) {
    setSeenSystem(unitSystem);
    setLengthText(pinLengthUnit(lengthText, seenSystem));
  }

  const result = useMemo<Result>(() => {
    const errors: Record<string, string> = {};
    const length = lengthText.trim() ? parseLength(lengthText, unitSystem) : null;
    const time = timeText.trim() ? parseQuantity(timeText, 'time', 'ns') : null;
    if (length && !length.ok) errors.lengthM = length.message;
    if (time && !time.ok) errors.roundTripNs = time.message;
    if (!length?.ok || !time?.ok) return { request: null, answer: null, errors };
    const request = { method: 'vf-calibration' as const, lengthM: length.value, roundTripNs: time.value * 1e9 };
    try {
      return { request, answer: runFaultLocation(request, unitSystem), errors };
    } catch (err) {
      if (!(err instanceof FaultLocationError)) throw err;
      return { request, answer: null, errors: { [err.field]: err.message } };
    }
  }, [lengthText, timeText, unitSystem]);

  const sameReadings = result.request !== null && JSON.stringify(check.variables?.request) === JSON.stringify(result.request);
  const current = sameReadings && check.variables?.unitSystem === unitSystem;
  // The server words its explanation in the user's units: after a switch, ask it again in the new ones.
  const reask = sameReadings && !current && check.isSuccess ? result.request : null;
  const { mutate } = check;
  useEffect(() => {
    if (reask) mutate({ request: reask, unitSystem });
  }, [reask, unitSystem, mutate]);
  const serverErrors: Record<string, string> = {};
  if (current && check.error instanceof ApiError) for (const e of check.error.errors) serverErrors[e.path] ??= e.message;
  const answer = (current && check.data) || result.answer;
  const vf = answer?.velocityFactor;

  return (
    <form
      noValidate
      aria-label="Velocity factor calibration"
      className="flex flex-col gap-4"
      onSubmit={(e) => {
        e.preventDefault();
        if (result.request) check.mutate({ request: result.request, unitSystem });
      }}
    >
      <TextField
        id="vf-lengthM"
        label={`${LENGTH.label} (${unitSystem === 'imperial' ? 'ft' : 'm'})`}
        value={lengthText}
        onChange={(e) => setLengthText(e.target.value)}
        inputMode="decimal"
        autoComplete="off"
        placeholder={`e.g. ${LENGTH.placeholder}`}
        error={serverErrors.lengthM ?? result.errors.lengthM}
      />
      <TextField
        id="vf-roundTripNs"
        label={`${ROUND_TRIP.label} (ns)`}
        value={timeText}
        onChange={(e) => setTimeText(e.target.value)}
        inputMode="decimal"
        autoComplete="off"
        placeholder={`e.g. ${ROUND_TRIP.placeholder}`}
        error={serverErrors.roundTripNs ?? result.errors.roundTripNs}
      />
      {answer && vf !== undefined && (
        <div className="rounded-lg bg-brand-soft p-4" aria-live="polite">
          <p className="text-lg">
            Velocity factor <strong data-testid="vf-result">{Number(vf.toPrecision(3))}</strong>
            <span className="ml-2 text-sm text-ink-soft">
              {unitSystem === 'imperial'
                ? `${Number((delayNsPerMetre(vf) * METRES_PER_FOOT).toPrecision(4))} ns per foot one way`
                : `${Number(delayNsPerMetre(vf).toPrecision(4))} ns per metre one way`}
            </span>
          </p>
          <p className="mt-2 text-sm">{answer.explanation}</p>
          <p className="mt-1 text-xs text-ink-soft">{current && check.data ? '✓ Checked by the server' : 'Worked out as you type'}</p>
        </div>
      )}
      {current && check.error && !(check.error instanceof ApiError && check.error.errors.length > 0) && (
        <Notice tone="error">{check.error.message}</Notice>
      )}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="secondary" disabled={!result.request || check.isPending}>
          Calculate
        </Button>
        {onUse && (
          <Button variant="ghost" disabled={vf === undefined} onClick={() => vf !== undefined && onUse(Number(vf.toPrecision(3)))}>
            Use in TDR
          </Button>
        )}
      </div>
    </form>
  );
}
