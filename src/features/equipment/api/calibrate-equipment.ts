import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { equipmentContracts } from '@shared/contracts/equipment';
import type { CalibrationInput } from '@shared/schemas/equipment';
import { equipmentItemQueryOptions } from './get-equipment-item';

export const calibrateEquipment = ({ id, ...input }: CalibrationInput & { id: string }) =>
  call(equipmentContracts.calibrate, { params: { id }, body: input });

export const useCalibrateEquipment = (id: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: calibrateEquipment,
    onSuccess: () => qc.invalidateQueries({ queryKey: equipmentItemQueryOptions(id).queryKey }),
  });
};
