import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { healthRepository } from '../db/health.repository';
import { healthContracts } from '../../shared/contracts/health';

export function healthRoutes(deps: AppDeps) {
  const health = apiRouter(deps);
  const healthRepo = healthRepository(deps.sqlite);
  // Healthy means a write can commit, not only that the file opens: readings must be storable.
  health.route(healthContracts.get, ({ res }) => {
    let db: 'ok' | 'error' = 'ok';
    try {
      healthRepo.probeWrite(new Date().toISOString());
    } catch (err) {
      db = 'error';
      deps.log.error('health check: the database cannot commit a write', err);
    }
    res.status(db === 'ok' ? 200 : 503);
    return { status: db === 'ok' ? ('ok' as const) : ('degraded' as const), db, version: deps.version };
  });
  return health;
}
