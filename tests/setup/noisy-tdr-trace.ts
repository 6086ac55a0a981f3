// Noisy synthetic TDR traces for the fault-locator API test and its Playwright spec: a step with
// a finite rise time, a reflection at a known delay, Gaussian noise from a seeded PRNG
// (reproducible), written as a scope's CSV export.

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

/** Logistic step, 50 % point at t = 0; its 10–90 % rise is 2 ln 9 · τ. */
function step(t: number, riseS: number): number {
  const tau = riseS / (2 * Math.log(9));
  return 1 / (1 + Math.exp(-t / tau));
}

export type NoisyTraceOptions = {
  samples?: number;
  dtS?: number;
  incidentS?: number;
  /** Round trip from the incident 50 % point to the reflection's; null for a matched cable. */
  roundTripS: number | null;
  /** +1 open, −1 short. */
  rho?: number;
  stepV?: number;
  riseS?: number;
  noiseV?: number;
  seed?: number;
};

export function synthesiseTrace(o: NoisyTraceOptions): { timeS: number[]; volts: number[] } {
  const n = o.samples ?? 2000;
  const dt = o.dtS ?? 1e-9;
  const incident = o.incidentS ?? 300e-9;
  const stepV = o.stepV ?? 0.5;
  const rise = o.riseS ?? 4e-9;
  const rho = o.rho ?? 1;
  const noise = gaussian(prng(o.seed ?? 1));
  const timeS: number[] = [];
  const volts: number[] = [];
  for (let i = 0; i < n; i++) {
    const t = i * dt;
    let v = stepV * step(t - incident, rise);
    // The reflection comes back a little slower: the cable smooths the edge.
    if (o.roundTripS !== null) v += rho * stepV * step(t - incident - o.roundTripS, rise * 1.5);
    timeS.push(t);
    volts.push(v + (o.noiseV ?? 0) * noise());
  }
  return { timeS, volts };
}

/** As a scope exports it: a metadata line, a header, then time and volts in scientific notation. */
export function traceCsv(trace: { timeS: number[]; volts: number[] }): string {
  const lines = ['Model,Synthetic scope', 'Time (s),Volts (V)'];
  for (let i = 0; i < trace.timeS.length; i++) lines.push(`${trace.timeS[i]!.toExponential(6)},${trace.volts[i]!.toExponential(6)}`);
  return `${lines.join('\n')}\n`;
}
