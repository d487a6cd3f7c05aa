import { Router } from 'express';
import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { exportRequestSchema } from '@shared/schemas/exports';
import { sheetParamsSchema } from '@shared/schemas/sheets';
import { idSchema } from '@shared/schemas/team';
import { requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { ExportsService } from './exports.service';

export function exportsRouter({ dataSource, exports }: { dataSource: DataSource; exports: ExportsService }): Router {
  const router = Router();
  const scoped = teamScope(dataSource);
  const view = requirePermission('team.view');
  const edit = requirePermission('sheets.edit');
  const teamId = (req: Request) => req.membership!.teamId;
  const exportParams = z.object({ teamId: idSchema, sheetId: idSchema, exportId: idSchema });
  router.post(
    '/teams/:teamId/sheets/:sheetId/exports',
    scoped,
    edit,
    route({ params: sheetParamsSchema, body: exportRequestSchema }, async ({ params, body }, req, res) => {
      res.status(202);
      return exports.start(teamId(req), req.user!.id, params.sheetId, body);
    }),
  );
  router.post(
    '/teams/:teamId/sheets/:sheetId/exports/:exportId/cancel',
    scoped,
    edit,
    route({ params: exportParams }, ({ params }, req) => exports.cancel(teamId(req), params.sheetId, params.exportId)),
  );
  router.get(
    '/teams/:teamId/sheets/:sheetId/exports/latest',
    scoped,
    view,
    route({ params: sheetParamsSchema }, async ({ params }, req) => ({ export: await exports.latest(teamId(req), params.sheetId) })),
  );
  router.get(
    '/teams/:teamId/sheets/:sheetId/exports/:exportId',
    scoped,
    view,
    route({ params: exportParams }, ({ params }, req) => exports.get(teamId(req), params.sheetId, params.exportId)),
  );
  router.get(
    '/teams/:teamId/sheets/:sheetId/exports/:exportId/download',
    scoped,
    view,
    route({ params: exportParams }, async ({ params }, req, res) => {
      const file = await exports.download(teamId(req), params.sheetId, params.exportId);
      res.attachment(file.name).type('zip').send(file.data);
    }),
  );
  router.get(
    '/teams/:teamId/sheets/:sheetId/exports/:exportId/files/:file',
    scoped,
    view,
    route(
      { params: exportParams.extend({ file: z.string().regex(/^[a-z0-9-]{1,80}\.(png|svg|pdf|dxf|txt)$/, 'Not a file of this export') }) },
      async ({ params }, req, res) => {
        const file = await exports.downloadFile(teamId(req), params.sheetId, params.exportId, params.file);
        // Always a download (never shown inline), so an SVG cannot run in the app's origin.
        res.attachment(file.name).type(file.type).send(file.data);
      },
    ),
  );
  return router;
}
