// The ordered test steps for one equipment position, from its kind and the limit profile.
import type { EquipmentKind, LimitProfile, TestKind } from './limits';

export interface PlannedStep {
  testKind: TestKind;
  conductors: string;
}

export interface PositionTemplateEntry {
  name: string;
  equipmentKind: EquipmentKind;
  /** Only on strips with a conductive piste. */
  pisteOnly?: boolean;
}

// Common practice for a fencing strip: the apparatus, a floor cable and a reel on each side,
// and the metal piste where there is one.
export const DEFAULT_POSITION_TEMPLATE: readonly PositionTemplateEntry[] = [
  { name: 'Scoring apparatus', equipmentKind: 'apparatus' },
  { name: 'Left floor cable', equipmentKind: 'floor-cable' },
  { name: 'Right floor cable', equipmentKind: 'floor-cable' },
  { name: 'Left reel', equipmentKind: 'reel' },
  { name: 'Right reel', equipmentKind: 'reel' },
  { name: 'Piste', equipmentKind: 'piste', pisteOnly: true },
];

// "other" items get no automatic steps: the default profile has no limit for them; a director adds
// steps (and a profile rule) for what the item is.
const CABLE_KINDS: readonly EquipmentKind[] = ['floor-cable', 'reel', 'body-wire'];

/** Conductors A, B, C end to end, then each pair's insulation, then loops where the profile asks. */
export function stepsForKind(kind: EquipmentKind, profile: Pick<LimitProfile, 'loopRequired'>): PlannedStep[] {
  if (kind === 'piste') {
    return [
      { testKind: 'piste-end-to-end', conductors: 'piste' },
      { testKind: 'piste-earth', conductors: 'piste-C' },
    ];
  }
  if (!CABLE_KINDS.includes(kind)) return [];
  const steps: PlannedStep[] = [
    { testKind: 'continuity', conductors: 'A' },
    { testKind: 'continuity', conductors: 'B' },
    { testKind: 'continuity', conductors: 'C' },
    { testKind: 'insulation', conductors: 'A-B' },
    { testKind: 'insulation', conductors: 'A-C' },
    { testKind: 'insulation', conductors: 'B-C' },
  ];
  if (profile.loopRequired?.includes(kind)) steps.push({ testKind: 'loop', conductors: 'A-B' });
  return steps;
}

/** What to measure and where to put the probes, in words a technician at a strip follows. */
export function stepInstruction(testKind: TestKind, conductors: string): string {
  switch (testKind) {
    case 'continuity':
      return `Line ${conductors} end to end: one probe on ${conductors} at each end of the cable.`;
    case 'insulation': {
      const [a, b] = conductors.split('-');
      return `Between lines ${a} and ${b}, far end left open: one probe on ${a}, the other on ${b}. Over range (OL) is good.`;
    }
    case 'loop': {
      const [a, b] = conductors.split('-');
      return `Loop ${a}+${b}: bridge ${a} and ${b} together at the far end, then measure ${a} to ${b} at the near end.`;
    }
    case 'piste-end-to-end':
      return 'Piste end to end: one probe on the metal at each end of the piste.';
    case 'piste-earth':
      return 'Piste earthing: one probe on the piste at its centre, the other on the apparatus earth (line C).';
  }
}

export const TEST_KIND_LABELS: Record<TestKind, string> = {
  continuity: 'Continuity',
  insulation: 'Insulation',
  loop: 'Loop resistance',
  'piste-end-to-end': 'Piste end to end',
  'piste-earth': 'Piste earthing',
};
