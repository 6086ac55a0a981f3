import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { EquipmentItem } from './types';

export interface EquipmentFilter {
  kind?: string;
  status?: string;
  q?: string;
}

export const getEquipmentList = (f: EquipmentFilter) => {
  const qs = new URLSearchParams(Object.entries(f).filter(([, v]) => v) as [string, string][]).toString();
  return api.get<EquipmentItem[]>(`/equipment${qs ? `?${qs}` : ''}`);
};
export const equipmentListQueryOptions = (f: EquipmentFilter = {}) =>
  queryOptions({ queryKey: ['equipment', 'list', f], queryFn: () => getEquipmentList(f), placeholderData: keepPreviousData });
export const useEquipmentList = (f: EquipmentFilter) => useQuery(equipmentListQueryOptions(f));
