import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { boardContracts as c } from '../../shared/contracts/board';
import { boardService } from '../services/board.service';

export function boardRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const board = boardService(deps);
  api.route(c.get, ({ user, params }) => board.board(user, params.id));
  return api;
}
