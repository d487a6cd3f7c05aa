import { Router } from 'express';
import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import { profileInputSchema, profileParamsSchema, sheetCreateSchema, sheetDuplicateSchema, sheetListQuerySchema, sheetParamsSchema, sheetSaveSchema } from '../../../shared/schemas/sheets';
import { teamParamsSchema } from '../../../shared/schemas/team';
import { requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { ProfilesService } from './profiles.service';
import type { SheetsService } from './sheets.service';
import type { ExportsService } from './exports.service';
import type { CostingService } from '../shop/costing.service';
import { exportRequestSchema } from '../../../shared/schemas/exports';
import { idSchema } from '../../../shared/schemas/team';
import { z } from 'zod';

const actorOf = (req: Request) => ({ userId: req.user!.id, teamId: req.membership!.teamId, role: req.membership!.role });

export function sheetsRouter({ dataSource, sheets, profiles, exports, costing }: { dataSource: DataSource; sheets: SheetsService; profiles: ProfilesService; exports: ExportsService; costing: CostingService }): Router {
  const router = Router();
  const scoped = teamScope(dataSource);
  const view = requirePermission('team.view');
  const edit = requirePermission('sheets.edit');
  const settings = requirePermission('team.settings');
  const teamId = (req: Request) => req.membership!.teamId;

  router.get('/teams/:teamId/sheet-profiles', scoped, view, route({ params: teamParamsSchema }, async (_i, req) => ({ profiles: await profiles.list(teamId(req)) })));
  router.post(
    '/teams/:teamId/sheet-profiles',
    scoped,
    settings,
    route({ params: teamParamsSchema, body: profileInputSchema }, async ({ body }, req, res) => {
      res.status(201);
      return profiles.create(teamId(req), body);
    }),
  );
  router.put('/teams/:teamId/sheet-profiles/:profileId', scoped, settings, route({ params: profileParamsSchema, body: profileInputSchema }, ({ params, body }, req) => profiles.update(teamId(req), params.profileId, body, false)));
  router.post('/teams/:teamId/sheet-profiles/:profileId/default', scoped, settings, route({ params: profileParamsSchema }, async ({ params }, req) => {
    const profile = await profiles.find(teamId(req), params.profileId);
    return profiles.update(teamId(req), params.profileId, profile, true);
  }));
  router.delete(
    '/teams/:teamId/sheet-profiles/:profileId',
    scoped,
    settings,
    route({ params: profileParamsSchema }, async ({ params }, req, res) => {
      await profiles.remove(teamId(req), params.profileId);
      res.status(204).end();
    }),
  );

  router.get('/teams/:teamId/sheets', scoped, view, route({ params: teamParamsSchema, query: sheetListQuerySchema }, async ({ query }, req) => ({ sheets: await costing.attach(teamId(req), await sheets.list(teamId(req), query)) })));
  router.post(
    '/teams/:teamId/sheets',
    scoped,
    edit,
    route({ params: teamParamsSchema, body: sheetCreateSchema }, async ({ body }, req, res) => {
      res.status(201);
      return sheets.create(actorOf(req), body);
    }),
  );
  router.get('/teams/:teamId/sheets/:sheetId', scoped, view, route({ params: sheetParamsSchema }, ({ params }, req) => sheets.detail(teamId(req), params.sheetId)));
  router.put('/teams/:teamId/sheets/:sheetId', scoped, edit, route({ params: sheetParamsSchema, body: sheetSaveSchema }, ({ params, body }, req) => sheets.save(actorOf(req), params.sheetId, body)));
  router.post(
    '/teams/:teamId/sheets/:sheetId/duplicate',
    scoped,
    edit,
    route({ params: sheetParamsSchema, body: sheetDuplicateSchema }, async ({ params, body }, req, res) => {
      res.status(201);
      return sheets.duplicate(actorOf(req), params.sheetId, body);
    }),
  );
  router.delete(
    '/teams/:teamId/sheets/:sheetId',
    scoped,
    edit,
    route({ params: sheetParamsSchema }, async ({ params }, req, res) => {
      await sheets.remove(actorOf(req), params.sheetId);
      res.status(204).end();
    }),
  );
  router.get(
    '/teams/:teamId/sheets/:sheetId/thumbnail',
    scoped,
    view,
    route({ params: sheetParamsSchema }, async ({ params }, req, res) => {
      res.type('png').set('Cache-Control', 'private, max-age=86400').send(await sheets.thumbnail(teamId(req), params.sheetId));
    }),
  );
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
  router.get('/teams/:teamId/sheets/:sheetId/exports/latest', scoped, view, route({ params: sheetParamsSchema }, async ({ params }, req) => ({ export: await exports.latest(teamId(req), params.sheetId) })));
  router.get('/teams/:teamId/sheets/:sheetId/exports/:exportId', scoped, view, route({ params: exportParams }, ({ params }, req) => exports.get(teamId(req), params.sheetId, params.exportId)));
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
    route({ params: exportParams.extend({ file: z.string().regex(/^[a-z0-9-]{1,80}\.(png|svg|pdf|dxf|txt)$/, 'Not a file of this export') }) }, async ({ params }, req, res) => {
      const file = await exports.downloadFile(teamId(req), params.sheetId, params.exportId, params.file);
      // Always a download (never shown inline), so an SVG cannot run in the app's origin.
      res.attachment(file.name).type(file.type).send(file.data);
    }),
  );
  return router;
}
