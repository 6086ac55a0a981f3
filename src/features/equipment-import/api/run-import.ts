import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api-client';
import type { ImportReport } from '@shared/schemas/equipment-import';
import { importForm, type ImportRequest } from './preview-import';

export const runImport = (req: ImportRequest) => apiRequest<ImportReport>('/equipment/import', { method: 'POST', body: importForm(req) });

/** The register's list lives in the equipment feature; its queries start with 'equipment'. */
export const useRunImport = () => {
  const qc = useQueryClient();
  return useMutation({ mutationFn: runImport, onSuccess: () => qc.invalidateQueries({ queryKey: ['equipment'] }) });
};
