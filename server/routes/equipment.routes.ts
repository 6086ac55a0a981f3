import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { ifMatchOf, setVersionTag } from '../http/etag';
import { idParams } from '../../shared/schemas/params';
import { calibrationSchema, createEquipmentSchema, equipmentQuerySchema, updateEquipmentSchema } from '../../shared/schemas/equipment';
import { equipmentService } from '../services/equipment.service';

const MANAGE = ['admin', 'director'] as const;

export function equipmentRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const equipment = equipmentService(deps);

  // Technicians and organisers read the register; admins and directors keep it.
  api.get('/equipment', STAFF, validate(equipmentQuerySchema, 'query'), (req, res) => {
    res.json(equipment.list(req.user!, req.query as never));
  });
  api.post('/equipment', MANAGE, validate(createEquipmentSchema), (req, res) => {
    const item = equipment.create(req.user!, req.body);
    setVersionTag(res, item.version);
    res.status(201).json(item);
  });
  api.get('/equipment/:id', STAFF, validate(idParams, 'params'), (req, res) => {
    const detail = equipment.detail(req.user!, String(req.params.id));
    setVersionTag(res, detail.item.version);
    res.json(detail);
  });
  api.patch('/equipment/:id', MANAGE, validate(idParams, 'params'), validate(updateEquipmentSchema), (req, res) => {
    const item = equipment.update(req.user!, String(req.params.id), ifMatchOf(req), req.body);
    setVersionTag(res, item.version);
    res.json(item);
  });
  api.post('/equipment/:id/calibrations', MANAGE, validate(idParams, 'params'), validate(calibrationSchema), (req, res) => {
    const result = equipment.calibrate(req.user!, String(req.params.id), req.body);
    setVersionTag(res, result.item.version);
    res.status(201).json(result);
  });
  return api;
}
