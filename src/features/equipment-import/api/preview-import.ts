import { useMutation } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { equipmentImportContracts } from '@shared/contracts/equipment-import';
import type { ImportMapping, ImportMode } from '@shared/schemas/equipment-import';

export interface ImportRequest {
  file: File;
  mapping?: ImportMapping | undefined;
  mode: ImportMode;
}

export function importForm({ file, mapping, mode }: ImportRequest): FormData {
  const form = new FormData();
  // Text fields before the file: multipart is read in order.
  if (mapping) form.append('mapping', JSON.stringify(mapping));
  form.append('mode', mode);
  form.append('file', file, file.name);
  return form;
}

/** Nothing is written: the rows as they would be imported, with their errors. */
export const previewImport = (req: ImportRequest) => call(equipmentImportContracts.preview, { body: importForm(req) });

export const usePreviewImport = () => useMutation({ mutationFn: previewImport });
