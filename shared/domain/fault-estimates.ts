// The saved estimates of one fault, and which of them may be weighed together.
//
// combineEstimates (fault-location.ts) narrows the band as if each estimate were a new,
// independent measurement. That is only true for estimates worked out from different readings
// (or by different methods from different readings): two estimates from the same two loop
// readings are the same information twice, and combining them would claim a precision the
// readings do not have. So estimates that share a reading of the fault are kept apart (the
// widest band of them stands for them), as are estimates made on the item at another length
// (before a cut-out) and ones that cannot be placed from the near end.

import { combineEstimates, type CombinedEstimate, type FaultEstimate } from './fault-location';
import { METHOD_DEFINITIONS, type InputQuantity, type LocateMethod, type MethodDefinition } from './fault-methods';
import { formatLength, formatOhm, roundSignificant, type LengthSystem } from './units';

export interface SavedEstimate {
  method: string;
  fromEnd: 'near' | 'far';
  /** From the near end; null when it cannot be placed there (from the far end, length unknown). */
  distanceFromNearM: number | null;
  uncertaintyM: number;
  inputs: Record<string, unknown>;
  /** The item's recorded length when the estimate was made; null when none was recorded. */
  itemLengthM: number | null;
}

export type ApartKind = 'same-readings' | 'other-length' | 'not-placed' | 'no-band';

export interface KeptApart {
  /** Index into the estimates given. */
  index: number;
  kind: ApartKind;
  /** One line, in the reader's units: why this one is shown beside the others, not weighed in. */
  reason: string;
}

export interface SavedCombination {
  /** The weighing of the estimates used; null when none can be used. */
  combined: CombinedEstimate | null;
  /** Indices of the estimates weighed, in the order given. */
  used: number[];
  apart: KeptApart[];
  /** The item's length the estimates used were made against. */
  itemLengthM: number | null;
}

const methodTitle = (method: string) =>
  (METHOD_DEFINITIONS as Record<string, MethodDefinition | undefined>)[method]?.title.toLowerCase() ?? method;

function readingText(quantity: InputQuantity, value: number, units: LengthSystem): string {
  switch (quantity) {
    case 'resistance':
      return formatOhm(value);
    case 'capacitance':
      return `${roundSignificant(value, 4)} nF`;
    case 'time':
      return `${roundSignificant(value, 4)} ns`;
    case 'length':
      return formatLength(value, units);
    default:
      return String(roundSignificant(value, 4));
  }
}

/** Each reading of the fault in an estimate, keyed so that the same reading has the same key in any method. */
function readingsOf(e: SavedEstimate, units: LengthSystem): Map<string, string> {
  const out = new Map<string, string>();
  const def = (METHOD_DEFINITIONS as Record<string, MethodDefinition | undefined>)[e.method as LocateMethod];
  if (!def) return out;
  const readings = def.inputs.filter((i) => i.reading && typeof e.inputs[i.name] === 'number');
  if (def.oneReading) {
    const [a, b] = readings.map((i) => e.inputs[i.name] as number);
    if (a !== undefined && b !== undefined)
      out.set(`${def.method}:${roundSignificant(a / b, 12)}`, `the balance at ${roundSignificant(a, 4)} : ${roundSignificant(b, 4)}`);
    return out;
  }
  for (const input of readings) {
    const value = e.inputs[input.name] as number;
    // A distance found by hand names its end: 3 m from the far end is not 3 m from the near end.
    const end = input.quantity === 'length' ? `${e.fromEnd}:` : '';
    out.set(`${input.quantity}:${end}${value}`, readingText(input.quantity, value, units));
  }
  return out;
}

/**
 * Which saved estimates of a fault are weighed together, and why the others are not. Estimates
 * are given oldest first; the latest one decides the item's length that counts.
 */
export function combineSavedEstimates(estimates: SavedEstimate[], units: LengthSystem = 'metric'): SavedCombination {
  const apart: KeptApart[] = [];
  if (estimates.length === 0) return { combined: null, used: [], apart, itemLengthM: null };
  const itemLengthM = estimates[estimates.length - 1]!.itemLengthM;

  const candidates: number[] = [];
  estimates.forEach((e, index) => {
    if (e.itemLengthM !== itemLengthM) {
      const then =
        e.itemLengthM === null ? 'when its length was not recorded' : `when the item was ${formatLength(e.itemLengthM, units)} long`;
      const now = itemLengthM === null ? 'a length not recorded' : formatLength(itemLengthM, units);
      apart.push({
        index,
        kind: 'other-length',
        reason: `Worked out ${then}, not the ${now} of the latest estimate: not measured on the same cable.`,
      });
    } else if (e.distanceFromNearM === null) {
      apart.push({
        index,
        kind: 'not-placed',
        reason: 'Measured from the far end and the item’s length was not recorded, so it cannot be placed from the apparatus end.',
      });
    } else if (!(e.uncertaintyM > 0) || !Number.isFinite(e.uncertaintyM)) {
      apart.push({ index, kind: 'no-band', reason: 'It has no uncertainty band, so it cannot be weighed with the others.' });
    } else {
      candidates.push(index);
    }
  });

  // Estimates that share a reading, directly or through another one, form a group.
  const readings = new Map(candidates.map((i) => [i, readingsOf(estimates[i]!, units)]));
  const group = new Map(candidates.map((i) => [i, i]));
  const root = (i: number): number => (group.get(i) === i ? i : root(group.get(i)!));
  for (const [x, i] of candidates.entries()) {
    for (const j of candidates.slice(x + 1)) {
      if ([...readings.get(i)!.keys()].some((k) => readings.get(j)!.has(k))) group.set(root(j), root(i));
    }
  }
  // The widest band of a group stands for it (the later one when equal): never narrower than what the readings support.
  const standsFor = new Map<number, number>();
  for (const i of candidates) {
    const r = root(i);
    const best = standsFor.get(r);
    if (best === undefined || estimates[i]!.uncertaintyM >= estimates[best]!.uncertaintyM) standsFor.set(r, i);
  }
  const used = candidates.filter((i) => standsFor.get(root(i)) === i);
  for (const i of candidates) {
    const kept = standsFor.get(root(i))!;
    if (kept === i) continue;
    const own = readings.get(i)!;
    const theirs = readings.get(kept)!;
    const shared = [...own.keys()].filter((k) => theirs.has(k)).map((k) => own.get(k)!);
    const what = shared.length > 0 ? `the same readings (${shared.join(', ')})` : 'readings it shares with the others';
    apart.push({
      index: i,
      kind: 'same-readings',
      reason: `Worked out from ${what} as the ${methodTitle(estimates[kept]!.method)} estimate (no. ${kept + 1}) that is used: weighing both would claim a precision the readings do not have.`,
    });
  }
  apart.sort((a, b) => a.index - b.index);

  if (used.length === 0) return { combined: null, used, apart, itemLengthM };
  const asDomain: FaultEstimate[] = used.map((i) => {
    const e = estimates[i]!;
    return { method: e.method, distanceM: e.distanceFromNearM!, uncertaintyM: e.uncertaintyM, explanation: '', inputs: {} };
  });
  const combined = combineEstimates(asDomain, units);
  const note =
    apart.length === 0
      ? ''
      : ` ${apart.length === 1 ? 'One estimate is' : `${apart.length} estimates are`} shown beside ${used.length === 1 ? 'it' : 'them'}, not weighed in: ${apart.map((a) => `no. ${a.index + 1}, ${firstLower(a.reason)}`).join(' ')}`;
  return {
    combined: {
      ...combined,
      disagreements: combined.disagreements.map(([a, b]) => [used[a]!, used[b]!]),
      explanation: combined.explanation + note,
    },
    used,
    apart,
    itemLengthM,
  };
}

function firstLower(text: string): string {
  return text.charAt(0).toLowerCase() + text.slice(1);
}
