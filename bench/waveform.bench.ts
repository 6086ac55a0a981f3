// Waveform analysis of a 1-million-sample CSV against bare parsing of the same file into numbers.
import { analyseWaveform, parseTraceCsv } from '../shared/domain/waveform';
import { bestOf, type BenchResult } from './lib';
import { syntheticCsv } from './large-jobs';

/** The least a parser must do: split lines and columns, turn text into numbers. */
function bareParse(text: string) {
  const time = new Float64Array(1_000_001);
  const volts = new Float64Array(1_000_001);
  let n = 0;
  let start = text.indexOf('\n') + 1;
  while (start < text.length) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    const comma = text.indexOf(',', start);
    time[n] = Number(text.slice(start, comma));
    volts[n] = Number(text.slice(comma + 1, end));
    n++;
    start = end + 1;
  }
  return n;
}

export async function run(): Promise<BenchResult> {
  const csv = syntheticCsv(1_000_000, 42);
  const bare = bestOf(5, () => bareParse(csv));
  const full = bestOf(5, () => analyseWaveform(parseTraceCsv(csv)));
  const ratio = full.ms / bare.ms;
  return {
    name: 'Waveform analysis, 1 000 000 samples',
    ratio,
    ratioMeaning: 'parse + analysis time ÷ bare parse time',
    target: '≤ 1.5',
    pass: ratio <= 1.5,
    figures: {
      csvMiB: +(csv.length / 2 ** 20).toFixed(1),
      bareParseMs: +bare.ms.toFixed(1),
      analysisMs: +full.ms.toFixed(1),
      roundTripNs: +(full.value.roundTripNs ?? NaN).toFixed(2),
    },
  };
}
