// Shared look-ups for the testing, fault and board tests: demo venues, strips and steps by name.
import { randomUUID } from 'node:crypto';
import type { TestApp } from '../setup/test-app';
import { DEMO } from '../setup/test-app';

export interface StripDto {
  id: string;
  label: string;
  status: string;
  venueId: string;
  positions: {
    id: string;
    name: string;
    equipmentKind: string;
    equipment: { id: string; assetTag: string; lengthM: number | null } | null;
    steps: { id: string; testKind: string; conductors: string; latest: { id: string; verdict: string } | null }[];
  }[];
  openFaults: { id: string; kind: string; status: string; positionId: string }[];
}

export async function venueIds(t: TestApp) {
  const marco = await t.agentFor(DEMO.director);
  const venues = (await marco.get('/api/venues')).body as { id: string; name: string }[];
  return {
    hall: venues.find((v) => v.name === 'Riverside Sports Hall')!.id,
    annex: venues.find((v) => v.name === 'Riverside Annex')!.id,
  };
}

export async function stripByLabel(t: TestApp, venueId: string, label: string): Promise<StripDto> {
  const marco = await t.agentFor(DEMO.director);
  const list = (await marco.get(`/api/venues/${venueId}/strips`)).body as { id: string; label: string }[];
  const found = list.find((s) => s.label === label);
  if (!found) throw new Error(`no strip ${label}`);
  return (await marco.get(`/api/strips/${found.id}`)).body as StripDto;
}

export function stepOf(strip: StripDto, positionName: string, testKind: string, conductors: string) {
  const position = strip.positions.find((p) => p.name === positionName);
  const step = position?.steps.find((s) => s.testKind === testKind && s.conductors === conductors);
  if (!position || !step) throw new Error(`no step ${positionName} ${testKind} ${conductors} on ${strip.label}`);
  return { position, step };
}

export const newReading = (stepId: string, value: string, extra: Record<string, unknown> = {}) => ({
  id: randomUUID(),
  stepId,
  value,
  ...extra,
});

/** Good values for every step of a floor cable (12 m), used for a passing retest. */
export const GOOD_VALUE: Record<string, string> = {
  continuity: '0.5',
  insulation: 'OL',
  loop: '1.0',
  'piste-end-to-end': '1.2',
  'piste-earth': '0.4',
};
