// An item's incidents across events, and whether the register flags it for inspection.
import type { Db } from '../db/client';
import type { EquipmentRow } from '../db/equipment.repository';

export function incidentHistory(_db: Db, item: EquipmentRow, _mayShow: (venueId: string) => boolean) {
  return {
    incidents: [] as never[],
    inspection: { flagged: item.toInspectIncidentId !== null, repeatedIncidents: false, toInspect: item.toInspectIncidentId !== null, incidentCount: 0, reason: null },
  };
}
