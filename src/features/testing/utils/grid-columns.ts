// The entry grid's columns: one per measurement found on the strip, in the checklist's order.
import type { TestKind } from '@shared/domain/limits';

export interface GridColumn {
  key: string;
  testKind: TestKind;
  conductors: string;
  /** Short header, e.g. "A", "A–B", "Loop". */
  short: string;
  group: string;
}

const ORDER: { testKind: TestKind; conductors: string; short: string; group: string }[] = [
  { testKind: 'continuity', conductors: 'A', short: 'A', group: 'Continuity' },
  { testKind: 'continuity', conductors: 'B', short: 'B', group: 'Continuity' },
  { testKind: 'continuity', conductors: 'C', short: 'C', group: 'Continuity' },
  { testKind: 'insulation', conductors: 'A-B', short: 'A–B', group: 'Insulation' },
  { testKind: 'insulation', conductors: 'A-C', short: 'A–C', group: 'Insulation' },
  { testKind: 'insulation', conductors: 'B-C', short: 'B–C', group: 'Insulation' },
  { testKind: 'loop', conductors: 'A-B', short: 'A+B', group: 'Loop' },
  { testKind: 'piste-end-to-end', conductors: 'piste', short: 'End to end', group: 'Piste' },
  { testKind: 'piste-earth', conductors: 'piste-C', short: 'Earth', group: 'Piste' },
];

export const cellKey = (s: { testKind: string; conductors: string }) => `${s.testKind} ${s.conductors}`;

/** The columns the strip's steps need; a step outside the usual set gets a column of its own at the end. */
export function gridColumns(steps: { testKind: TestKind; conductors: string }[]): GridColumn[] {
  const present = new Set(steps.map(cellKey));
  const known = ORDER.filter((c) => present.has(cellKey(c))).map((c) => ({ ...c, key: cellKey(c) }));
  const extra = [...present]
    .filter((k) => !ORDER.some((c) => cellKey(c) === k))
    .map((k) => {
      const s = steps.find((x) => cellKey(x) === k)!;
      return {
        key: k,
        testKind: s.testKind,
        conductors: s.conductors,
        short: s.conductors.replace('-', '–'),
        group: s.testKind === 'loop' ? 'Loop' : s.testKind === 'insulation' ? 'Insulation' : 'Other',
      };
    });
  return [...known, ...extra];
}
