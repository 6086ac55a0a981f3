import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { singleFileUpload, uploadedFile } from '../http/upload';
import { AppError } from '../lib/app-error';
import { IMPORT_LIMITS } from '../../shared/schemas/equipment-import';
import { equipmentImportContracts as c } from '../../shared/contracts/equipment-import';
import { equipmentImportService } from '../services/equipment-import.service';

export function equipmentImportRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const registerImport = equipmentImportService(deps);
  const upload = singleFileUpload({
    maxBytesFor: (name) => {
      if (!/\.(csv|txt|xlsx)$/i.test(name)) throw new AppError(415, 'unsupported-type', 'Import a CSV (.csv) or Excel workbook (.xlsx).');
      return IMPORT_LIMITS.maxBytes;
    },
    absoluteMaxBytes: IMPORT_LIMITS.maxBytes,
    maxFields: 4,
  });
  api.route(c.preview, ({ user, body, req }) => registerImport.preview(user, uploadedFile(req), body), { before: [upload] });
  api.route(c.run, ({ user, body, req }) => registerImport.run(user, uploadedFile(req), body), { before: [upload] });
  api.route(c.csv, ({ user, res }) => {
    const { fileName, body } = registerImport.csv(user);
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${fileName}"`);
    res.set('X-Content-Type-Options', 'nosniff');
    res.send(body);
  });
  return api;
}
