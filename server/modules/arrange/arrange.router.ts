import { Router } from 'express';
import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { arrangeRunSchema } from '@shared/schemas/arrange';
import { sheetParamsSchema } from '@shared/schemas/sheets';
import { idSchema } from '@shared/schemas/team';
import { requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { ArrangeRunsService } from './arrange.service';

export function arrangeRouter({ dataSource, runs }: { dataSource: DataSource; runs: ArrangeRunsService }): Router {
  const router = Router();
  const scoped = teamScope(dataSource);
  const view = requirePermission('team.view');
  const edit = requirePermission('sheets.edit');
  const teamId = (req: Request) => req.membership!.teamId;
  const runParams = z.object({ teamId: idSchema, sheetId: idSchema, runId: z.uuid('Not an arrange run') });

  router.post(
    '/teams/:teamId/sheets/:sheetId/arrange-runs',
    scoped,
    edit,
    route({ params: sheetParamsSchema, body: arrangeRunSchema }, async ({ params, body }, req, res) => {
      res.status(202);
      return runs.start(teamId(req), req.user!.id, params.sheetId, body);
    }),
  );
  router.get(
    '/teams/:teamId/sheets/:sheetId/arrange-runs/:runId',
    scoped,
    view,
    route({ params: runParams }, ({ params }, req) => runs.get(teamId(req), params.sheetId, params.runId)),
  );
  router.post(
    '/teams/:teamId/sheets/:sheetId/arrange-runs/:runId/stop',
    scoped,
    edit,
    route({ params: runParams }, ({ params }, req) => runs.stop(teamId(req), params.sheetId, params.runId)),
  );
  return router;
}
