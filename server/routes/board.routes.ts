import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { boardService } from '../services/board.service';

export function boardRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const board = boardService(deps);
  api.get('/venues/:id/board', STAFF, validate(idParams, 'params'), (req, res) => {
    res.json(board.board(req.user!, String(req.params.id)));
  });
  return api;
}
