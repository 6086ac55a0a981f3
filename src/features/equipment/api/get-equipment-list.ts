import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { equipmentContracts } from '@shared/contracts/equipment';
import { EQUIPMENT_KINDS } from '@shared/domain/limits';
import { EQUIPMENT_STATUSES } from '@shared/schemas/equipment';

/** What the register's filters hold: an empty choice means "all". */
export interface EquipmentFilter {
  kind?: string;
  status?: string;
  q?: string;
}

export const getEquipmentList = (f: EquipmentFilter) =>
  call(equipmentContracts.list, {
    query: { kind: EQUIPMENT_KINDS.find((k) => k === f.kind), status: EQUIPMENT_STATUSES.find((st) => st === f.status), q: f.q },
  });
export const equipmentListQueryOptions = (f: EquipmentFilter = {}) =>
  queryOptions({ queryKey: ['equipment', 'list', f], queryFn: () => getEquipmentList(f), placeholderData: keepPreviousData });
export const useEquipmentList = (f: EquipmentFilter) => useQuery(equipmentListQueryOptions(f));
