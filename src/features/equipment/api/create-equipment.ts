import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateEquipmentInput } from '@shared/schemas/equipment';
import { equipmentListQueryOptions } from './get-equipment-list';
import type { EquipmentItem } from './types';

export const createEquipment = (input: CreateEquipmentInput) => api.post<EquipmentItem>('/equipment', input as Record<string, unknown>);

export const useCreateEquipment = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createEquipment,
    // Every filtered list starts with the same key prefix.
    onSuccess: () => qc.invalidateQueries({ queryKey: equipmentListQueryOptions().queryKey.slice(0, 2) }),
  });
};
