import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { equipmentContracts } from '@shared/contracts/equipment';
import type { UpdateEquipmentInput } from '@shared/schemas/equipment';
import { equipmentItemQueryOptions } from './get-equipment-item';
import { equipmentListQueryOptions } from './get-equipment-list';

/** Sends the version the form was loaded with; a 412 means someone else saved first. */
export const updateEquipment = ({ id, version, patch }: { id: string; version: number; patch: UpdateEquipmentInput }) =>
  call(equipmentContracts.update, { params: { id }, body: patch, headers: { 'If-Match': `"${version}"` } });

export const useUpdateEquipment = (id: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateEquipment,
    onSuccess: () => {
      qc.invalidateQueries({ queryKey: equipmentItemQueryOptions(id).queryKey });
      qc.invalidateQueries({ queryKey: equipmentListQueryOptions().queryKey.slice(0, 2) });
    },
  });
};
