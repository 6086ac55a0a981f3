// npm run bench [name…]: each benchmark prints its figures as a ratio to a limit measured in the
// same run, plus the absolute values, and all are written to bench/results/latest.json.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { cpus, totalmem } from 'node:os';
import type { BenchResult } from './lib';

const all: Record<string, () => Promise<{ run: () => Promise<BenchResult> }>> = {
  writes: () => import('./writes.bench'),
  waveform: () => import('./waveform.bench'),
  verdicts: () => import('./verdicts.bench'),
  certificate: () => import('./certificate.bench'),
  'testing-screen': () => import('./testing-screen.bench'),
  'hall-network': () => import('./hall-network.bench'),
  mixed: () => import('./mixed.bench'),
};

const wanted = process.argv.slice(2).length ? process.argv.slice(2) : Object.keys(all);
// Each result is stored with the benchmark's short name and when it ran.
type Stored = BenchResult & { key: string; at: string };
const results: Stored[] = [];
for (const name of wanted) {
  if (!all[name]) {
    console.error(`Unknown benchmark "${name}". Known: ${Object.keys(all).join(', ')}`);
    process.exit(2);
  }
  process.stdout.write(`${name}… `);
  const r = await (await all[name]()).run();
  results.push({ key: name, at: new Date().toISOString(), ...r });
  console.log(`${r.pass ? 'meets' : 'MISSES'} target ${r.target}: ratio ${r.ratio.toFixed(3)} (${r.ratioMeaning})`);
  for (const [k, v] of Object.entries(r.figures)) console.log(`    ${k}: ${v}`);
}
const machine = {
  cpus: cpus().length,
  cpuModel: cpus()[0]?.model ?? 'unknown',
  memoryGiB: Math.round(totalmem() / 2 ** 30),
  node: process.version,
};
// Benchmarks not run this time keep their last result (each says when it ran).
const file = 'bench/results/latest.json';
const earlier: Stored[] = existsSync(file) ? ((JSON.parse(readFileSync(file, 'utf8')) as { results?: Stored[] }).results ?? []) : [];
const merged = Object.keys(all).flatMap((key) => {
  const fresh = results.find((r) => r.key === key);
  return fresh ? [fresh] : earlier.filter((r) => r.key === key);
});
mkdirSync('bench/results', { recursive: true });
writeFileSync(file, JSON.stringify({ machine, results: merged }, null, 2));
console.log(
  `\nWritten to bench/results/latest.json (${machine.cpus} × ${machine.cpuModel}, ${machine.memoryGiB} GiB, Node ${machine.node})`,
);
