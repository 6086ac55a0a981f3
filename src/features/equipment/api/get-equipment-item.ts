import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { EquipmentDetail } from './types';

export const getEquipmentItem = (id: string) => api.get<EquipmentDetail>(`/equipment/${id}`);
export const equipmentItemQueryOptions = (id: string) => queryOptions({ queryKey: ['equipment', 'item', id], queryFn: () => getEquipmentItem(id) });
export const useEquipmentItem = (id: string) => useQuery(equipmentItemQueryOptions(id));
