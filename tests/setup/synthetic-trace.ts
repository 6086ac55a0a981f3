// Synthetic TDR traces with a known round trip, shared by the API tests and the Playwright specs.

export interface SyntheticTrace {
  csv: string;
  incidentS: number;
  reflectionS: number;
  roundTripNs: number;
  sampleIntervalS: number;
}

/**
 * A step of `stepV` at `incidentS` (50 % point), and at `incidentS + roundTripNs` a reflection of
 * `rho · stepV` (−1 for a short: the line falls back to the baseline). Edges are symmetric ramps of
 * `riseS`, so their 50 % points are exactly where asked; a small deterministic ripple stands in for noise.
 */
export function syntheticTdrTrace(opts: {
  roundTripNs: number;
  incidentS?: number;
  sampleIntervalS?: number;
  samples?: number;
  stepV?: number;
  rho?: number;
  riseS?: number;
  header?: boolean;
}): SyntheticTrace {
  const dt = opts.sampleIntervalS ?? 0.2e-9;
  const n = opts.samples ?? 2000;
  const t0 = opts.incidentS ?? 50e-9;
  const stepV = opts.stepV ?? 1;
  const rho = opts.rho ?? -1;
  const rise = opts.riseS ?? 1.2e-9;
  const t1 = t0 + opts.roundTripNs * 1e-9;
  const ramp = (t: number, at: number) => Math.min(1, Math.max(0, (t - at) / rise + 0.5));
  const lines: string[] = opts.header === false ? [] : ['Time (s),Channel 1 (V)'];
  for (let i = 0; i < n; i++) {
    const t = i * dt;
    const v = stepV * ramp(t, t0) + rho * stepV * ramp(t, t1) + 0.002 * Math.sin(i * 1.7);
    lines.push(`${t.toExponential(6)},${v.toFixed(5)}`);
  }
  return { csv: `${lines.join('\n')}\n`, incidentS: t0, reflectionS: t1, roundTripNs: opts.roundTripNs, sampleIntervalS: dt };
}

/** Round trip for a fault at `distanceM` on a cable of velocity factor `vf` (d = VF · c · Δt / 2). */
export const roundTripNsFor = (distanceM: number, vf: number) => ((2 * distanceM) / (vf * 299_792_458)) * 1e9;
