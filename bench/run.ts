// npm run bench [name…]: each benchmark prints its figures as a ratio to a limit measured in the
// same run, plus the absolute values, and all are written to bench/results/latest.json.
import { mkdirSync, writeFileSync } from 'node:fs';
import { cpus, totalmem } from 'node:os';
import type { BenchResult } from './lib';

const all: Record<string, () => Promise<{ run: () => Promise<BenchResult> }>> = {
  writes: () => import('./writes.bench'),
  waveform: () => import('./waveform.bench'),
  verdicts: () => import('./verdicts.bench'),
  certificate: () => import('./certificate.bench'),
  'testing-screen': () => import('./testing-screen.bench'),
};

const wanted = process.argv.slice(2).length ? process.argv.slice(2) : Object.keys(all);
const results: BenchResult[] = [];
for (const name of wanted) {
  if (!all[name]) {
    console.error(`Unknown benchmark "${name}". Known: ${Object.keys(all).join(', ')}`);
    process.exit(2);
  }
  process.stdout.write(`${name}… `);
  const r = await (await all[name]()).run();
  results.push(r);
  console.log(`${r.pass ? 'meets' : 'MISSES'} target ${r.target}: ratio ${r.ratio.toFixed(3)} (${r.ratioMeaning})`);
  for (const [k, v] of Object.entries(r.figures)) console.log(`    ${k}: ${v}`);
}
const machine = { cpus: cpus().length, cpuModel: cpus()[0]?.model ?? 'unknown', memoryGiB: Math.round(totalmem() / 2 ** 30), node: process.version };
mkdirSync('bench/results', { recursive: true });
writeFileSync('bench/results/latest.json', JSON.stringify({ at: new Date().toISOString(), machine, results }, null, 2));
console.log(`\nWritten to bench/results/latest.json (${machine.cpus} × ${machine.cpuModel}, ${machine.memoryGiB} GiB, Node ${machine.node})`);
