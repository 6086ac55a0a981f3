import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { ifMatchOf, setVersionTag } from '../http/etag';
import { idParams } from '../../shared/schemas/params';
import { copyProfileSchema, updateProfileSchema } from '../../shared/schemas/limit-profile';
import { profilesService } from '../services/profiles.service';

const MANAGE = ['admin', 'director'] as const;

export function profilesRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const profiles = profilesService(deps);

  api.get('/profiles', STAFF, (req, res) => {
    res.json(profiles.list(req.user!));
  });
  api.get('/profiles/:id', STAFF, validate(idParams, 'params'), (req, res) => {
    const p = profiles.get(req.user!, String(req.params.id));
    setVersionTag(res, p.version);
    res.json(p);
  });
  api.post('/profiles/:id/copy', MANAGE, validate(idParams, 'params'), validate(copyProfileSchema), (req, res) => {
    const p = profiles.copy(req.user!, String(req.params.id), req.body.name);
    setVersionTag(res, p.version);
    res.status(201).json(p);
  });
  // An edit is stored as a new version of the lineage (201), never over an old one.
  api.put('/profiles/:id', MANAGE, validate(idParams, 'params'), validate(updateProfileSchema), (req, res) => {
    const p = profiles.update(req.user!, String(req.params.id), ifMatchOf(req), req.body);
    setVersionTag(res, p.version);
    res.status(201).json(p);
  });
  return api;
}
