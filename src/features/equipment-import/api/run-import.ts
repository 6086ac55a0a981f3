import { useMutation, useQueryClient } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { equipmentImportContracts } from '@shared/contracts/equipment-import';
import { importForm, type ImportRequest } from './preview-import';

export const runImport = (req: ImportRequest) => call(equipmentImportContracts.run, { body: importForm(req) });

/** The register's list lives in the equipment feature; its queries start with 'equipment'. */
export const useRunImport = () => {
  const qc = useQueryClient();
  return useMutation({ mutationFn: runImport, onSuccess: () => qc.invalidateQueries({ queryKey: ['equipment'] }) });
};
