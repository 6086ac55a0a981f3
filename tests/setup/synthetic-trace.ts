// Synthetic TDR traces with a known round trip, for the domain and API tests and the Playwright
// specs: a step with a finite rise time, a reflection at a known delay and coefficient, an
// optional sloped baseline, and Gaussian noise from a seeded PRNG (so every trace is reproducible).

/** mulberry32: small seeded PRNG. */
export function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Box–Muller normal deviates from a uniform source. */
export function gaussian(random: () => number): () => number {
  return () => {
    const u = Math.max(random(), 1e-12);
    const v = random();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
}

/** Logistic step, symmetric about t = 0 (its 50 % point); its 10–90 % rise is 2 ln 9 · τ. */
function step(t: number, riseS: number): number {
  const tau = riseS / (2 * Math.log(9));
  return 1 / (1 + Math.exp(-t / tau));
}

export type SyntheticTraceOptions = {
  samples?: number;
  /** Sample interval. */
  dtS?: number;
  /** 50 % point of the incident edge. */
  incidentS?: number;
  /** Round trip from the incident 50 % point to the reflection's; null for a matched cable. */
  roundTripS: number | null;
  /** Reflection coefficient: +1 open, −1 short. */
  rho?: number;
  stepV?: number;
  /** 10–90 % rise of the incident edge; the reflection comes back 1.5 times slower. */
  riseS?: number;
  /** σ of the Gaussian noise. */
  noiseV?: number;
  slopeVPerS?: number;
  offsetV?: number;
  seed?: number;
};

export type SyntheticTrace = { timeS: Float64Array; volts: Float64Array };

export function synthesiseTrace(o: SyntheticTraceOptions): SyntheticTrace {
  const n = o.samples ?? 2000;
  const dt = o.dtS ?? 1e-9;
  const incident = o.incidentS ?? 300e-9;
  const stepV = o.stepV ?? 0.5;
  const rise = o.riseS ?? 4e-9;
  const rho = o.rho ?? 1;
  const noise = gaussian(prng(o.seed ?? 1));
  const timeS = new Float64Array(n);
  const volts = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = i * dt;
    let v = (o.offsetV ?? 0) + (o.slopeVPerS ?? 0) * t + stepV * step(t - incident, rise);
    // The reflection comes back a little slower: the cable smooths the edge.
    if (o.roundTripS !== null) v += rho * stepV * step(t - incident - o.roundTripS, rise * 1.5);
    timeS[i] = t;
    volts[i] = v + (o.noiseV ?? 0) * noise();
  }
  return { timeS, volts };
}

/** As a scope exports it: a metadata line, a header, then time and volts in scientific notation. */
export function traceCsv(trace: { timeS: ArrayLike<number>; volts: ArrayLike<number> }): string {
  const lines = ['Model,Synthetic scope', 'Time (s),Volts (V)'];
  for (let i = 0; i < trace.timeS.length; i++) lines.push(`${trace.timeS[i]!.toExponential(6)},${trace.volts[i]!.toExponential(6)}`);
  return `${lines.join('\n')}\n`;
}

/**
 * A trace as an uploaded CSV, with the times the analysis should find: by default a short (ρ −1)
 * on a 1 V step at 50 ns, 0.2 ns per sample, 1.2 ns rise, 2 mV of noise.
 */
export function syntheticTdrTrace(opts: {
  roundTripNs: number;
  incidentS?: number;
  sampleIntervalS?: number;
  samples?: number;
  stepV?: number;
  rho?: number;
  riseS?: number;
  noiseV?: number;
  seed?: number;
}): { csv: string; incidentS: number; reflectionS: number; roundTripNs: number; sampleIntervalS: number } {
  const dtS = opts.sampleIntervalS ?? 0.2e-9;
  const incidentS = opts.incidentS ?? 50e-9;
  const trace = synthesiseTrace({
    samples: opts.samples ?? 2000,
    dtS,
    incidentS,
    roundTripS: opts.roundTripNs * 1e-9,
    rho: opts.rho ?? -1,
    stepV: opts.stepV ?? 1,
    riseS: opts.riseS ?? 1.2e-9,
    noiseV: opts.noiseV ?? 0.002,
    seed: opts.seed ?? 1,
  });
  return {
    csv: traceCsv(trace),
    incidentS,
    reflectionS: incidentS + opts.roundTripNs * 1e-9,
    roundTripNs: opts.roundTripNs,
    sampleIntervalS: dtS,
  };
}

/** Round trip for a fault at `distanceM` on a cable of velocity factor `vf` (d = VF · c · Δt / 2). */
export const roundTripNsFor = (distanceM: number, vf: number) => ((2 * distanceM) / (vf * 299_792_458)) * 1e9;
