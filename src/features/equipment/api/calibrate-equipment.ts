import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CalibrationInput } from '@shared/schemas/equipment';
import { equipmentItemQueryOptions } from './get-equipment-item';

export interface CalibrationResult {
  id: string;
  velocityFactor: number;
  velocityFactorUncertainty: number;
  explanation: string;
}

export const calibrateEquipment = ({ id, ...input }: CalibrationInput & { id: string }) =>
  api.post<CalibrationResult>(`/equipment/${id}/calibrations`, input);

export const useCalibrateEquipment = (id: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: calibrateEquipment,
    onSuccess: () => qc.invalidateQueries({ queryKey: equipmentItemQueryOptions(id).queryKey }),
  });
};
