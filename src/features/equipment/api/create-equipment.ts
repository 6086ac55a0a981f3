import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { equipmentContracts } from '@shared/contracts/equipment';
import type { CreateEquipmentInput } from '@shared/schemas/equipment';
import { equipmentListQueryOptions } from './get-equipment-list';

export const createEquipment = (input: CreateEquipmentInput) => call(equipmentContracts.create, { body: input });

export const useCreateEquipment = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createEquipment,
    // Every filtered list starts with the same key prefix.
    onSuccess: () => qc.invalidateQueries({ queryKey: equipmentListQueryOptions().queryKey.slice(0, 2) }),
  });
};
