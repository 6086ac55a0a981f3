// The demo venues' plan: register items with their tags, strips, positions and checklist steps.
import type { Tx } from './client';
import * as t from './schema';
import { newId } from '../lib/ids';
import { DEFAULT_LIMIT_PROFILE, type EquipmentKind } from '../../shared/domain/limits';
import { DEFAULT_POSITION_TEMPLATE, stepsForKind } from '../../shared/domain/checklist';

export const FLOOR_CABLE_M = 12;
export const REEL_M = 20;

/** Register items with tags in order per kind (APP-001, FC-001, …), each with its kind's spec. */
export function itemMaker(tx: Tx, orgId: string) {
  let tagNo = { APP: 0, FC: 0, RL: 0, PST: 0 };
  const nextTag = (kind: EquipmentKind) => {
    const prefix = kind === 'apparatus' ? 'APP' : kind === 'floor-cable' ? 'FC' : kind === 'reel' ? 'RL' : 'PST';
    tagNo = { ...tagNo, [prefix]: tagNo[prefix as keyof typeof tagNo] + 1 };
    return `${prefix}-${String(tagNo[prefix as keyof typeof tagNo]).padStart(3, '0')}`;
  };
  return (kind: EquipmentKind) => {
    const id = newId();
    const spec =
      kind === 'floor-cable'
        ? {
            lengthM: FLOOR_CABLE_M,
            conductorMm2: 0.75,
            cableType: '3-core PVC floor cable',
            velocityFactor: 0.6,
            description: '12 m floor cable, 3 × 0.75 mm²',
          }
        : kind === 'reel'
          ? { lengthM: REEL_M, conductorMm2: 0.5, cableType: 'Reel wire', description: '20 m spring reel' }
          : kind === 'piste'
            ? { lengthM: 14, description: 'Conductive metal piste, 14 m' }
            : { description: 'Scoring apparatus, three weapons' };
    tx.insert(t.equipment)
      .values({ id, orgId, assetTag: nextTag(kind), kind, ...spec })
      .run();
    return id;
  };
}

export interface SeedPosition {
  id: string;
  name: string;
  kind: EquipmentKind;
  equipmentId: string;
  lengthM: number | null;
  steps: { id: string; testKind: (typeof t.steps.$inferSelect)['testKind']; conductors: string }[];
}

export function makeVenue(
  tx: Tx,
  v: {
    eventId: string;
    profileId: string;
    name: string;
    technician: string;
    strips: { label: string; zone: string; conductive: boolean }[];
    makeItem: (kind: EquipmentKind) => string;
  },
) {
  const venueId = newId();
  tx.insert(t.venues).values({ id: venueId, eventId: v.eventId, name: v.name, profileId: v.profileId }).run();
  tx.insert(t.venueTechnicians).values({ venueId, userId: v.technician }).run();
  const strips = v.strips.map((s, si) => {
    const stripId = newId();
    tx.insert(t.strips)
      .values({ id: stripId, venueId, label: s.label, sortOrder: si + 1, zone: s.zone, conductivePiste: s.conductive })
      .run();
    const positions: SeedPosition[] = DEFAULT_POSITION_TEMPLATE.filter((p) => !p.pisteOnly || s.conductive).map((p, pi) => {
      const positionId = newId();
      const equipmentId = v.makeItem(p.equipmentKind);
      tx.insert(t.positions)
        .values({ id: positionId, stripId, name: p.name, equipmentKind: p.equipmentKind, equipmentId, sortOrder: pi + 1 })
        .run();
      tx.insert(t.positionAssignments).values({ id: newId(), positionId, equipmentId, assignedAt: '2026-11-20T16:00:00.000Z' }).run();
      const steps = stepsForKind(p.equipmentKind, DEFAULT_LIMIT_PROFILE).map((st, k) => {
        const id = newId();
        tx.insert(t.steps)
          .values({ id, positionId, testKind: st.testKind, conductors: st.conductors, sortOrder: k + 1 })
          .run();
        return { id, ...st };
      });
      const lengthM =
        p.equipmentKind === 'floor-cable' ? FLOOR_CABLE_M : p.equipmentKind === 'reel' ? REEL_M : p.equipmentKind === 'piste' ? 14 : null;
      return { id: positionId, name: p.name, kind: p.equipmentKind, equipmentId, lengthM, steps };
    });
    return { id: stripId, label: s.label, positions };
  });
  return { id: venueId, strips };
}
