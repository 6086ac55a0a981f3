import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { singleFileUpload, uploadedFile } from '../http/upload';
import { AppError } from '../lib/app-error';
import { IMPORT_LIMITS, importOptionsSchema } from '../../shared/schemas/equipment-import';
import { equipmentImportService } from '../services/equipment-import.service';

const MANAGE = ['admin', 'director'] as const;

// The register from and to spreadsheets. Import: those who keep the register; export: all staff.
export function equipmentImportRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const registerImport = equipmentImportService(deps);
  const upload = singleFileUpload({
    maxBytesFor: (name) => {
      if (!/\.(csv|txt|xlsx)$/i.test(name)) throw new AppError(415, 'unsupported-type', 'Import a CSV (.csv) or Excel workbook (.xlsx).');
      return IMPORT_LIMITS.maxBytes;
    },
    absoluteMaxBytes: IMPORT_LIMITS.maxBytes,
    maxFields: 4,
  });

  api.post('/equipment/import/preview', MANAGE, upload, async (req, res) => {
    const options = importOptionsSchema.parse(req.body ?? {});
    res.json(await registerImport.preview(req.user!, uploadedFile(req), options));
  });
  api.post('/equipment/import', MANAGE, upload, async (req, res) => {
    const options = importOptionsSchema.parse(req.body ?? {});
    res.json(await registerImport.run(req.user!, uploadedFile(req), options));
  });
  api.get('/equipment.csv', STAFF, (req, res) => {
    const { fileName, body } = registerImport.csv(req.user!);
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${fileName}"`);
    res.set('X-Content-Type-Options', 'nosniff');
    res.send(body);
  });
  return api;
}
