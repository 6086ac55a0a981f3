import { contract, file, json, KEEPERS, multipart, STAFF } from './contract';
import { importOptionsSchema, importPreviewSchema, importReportSchema } from '../schemas/equipment-import';

/**
 * The register from and to spreadsheets. Import: those who keep the register, a CSV or XLSX file
 * in the field `file` with the text fields mapping (JSON) and mode before it; export: all staff.
 */
export const equipmentImportContracts = {
  /** Nothing is written: the rows as they would be imported, with their errors. */
  preview: contract({
    method: 'POST',
    path: '/equipment/import/preview',
    access: KEEPERS,
    body: multipart(importOptionsSchema),
    answer: json(importPreviewSchema),
  }),
  run: contract({
    method: 'POST',
    path: '/equipment/import',
    access: KEEPERS,
    body: multipart(importOptionsSchema),
    answer: json(importReportSchema),
  }),
  csv: contract({ method: 'GET', path: '/equipment.csv', access: STAFF, answer: file('text/csv') }),
};
