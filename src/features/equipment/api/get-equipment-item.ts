import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { equipmentContracts } from '@shared/contracts/equipment';

export const getEquipmentItem = (id: string) => call(equipmentContracts.get, { params: { id } });
export const equipmentItemQueryOptions = (id: string) =>
  queryOptions({ queryKey: ['equipment', 'item', id], queryFn: () => getEquipmentItem(id) });
export const useEquipmentItem = (id: string) => useQuery(equipmentItemQueryOptions(id));
