import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { UpdateEquipmentInput } from '@shared/schemas/equipment';
import { equipmentItemQueryOptions } from './get-equipment-item';
import { equipmentListQueryOptions } from './get-equipment-list';
import type { EquipmentItem } from './types';

/** Sends the version the form was loaded with; a 412 means someone else saved first. */
export const updateEquipment = ({ id, version, patch }: { id: string; version: number; patch: UpdateEquipmentInput }) =>
  api.patch<EquipmentItem>(`/equipment/${id}`, patch as Record<string, unknown>, { 'If-Match': `"${version}"` });

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
