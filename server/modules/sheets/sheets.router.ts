import { Router } from 'express';
import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import {
  profileInputSchema,
  profileParamsSchema,
  sheetCreateSchema,
  sheetDuplicateSchema,
  sheetListQuerySchema,
  sheetParamsSchema,
  sheetSaveSchema,
} from '@shared/schemas/sheets';
import { teamParamsSchema } from '@shared/schemas/team';
import { actorOf, requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { ProfilesService } from './profiles.service';
import type { SheetsService } from './sheets.service';
import type { SheetSummary } from '@shared/schemas/sheets';

/** Adds what modules above this one know of each listed sheet (its cost, from the print shop). */
type SheetListExtras = (teamId: string, list: SheetSummary[]) => Promise<SheetSummary[]>;

export function sheetsRouter({
  dataSource,
  sheets,
  profiles,
  listExtras,
}: {
  dataSource: DataSource;
  sheets: SheetsService;
  profiles: ProfilesService;
  listExtras: SheetListExtras;
}): Router {
  const router = Router();
  const scoped = teamScope(dataSource);
  const view = requirePermission('team.view');
  const edit = requirePermission('sheets.edit');
  const settings = requirePermission('team.settings');
  const teamId = (req: Request) => req.membership!.teamId;

  router.get(
    '/teams/:teamId/sheet-profiles',
    scoped,
    view,
    route({ params: teamParamsSchema }, async (_i, req) => ({ profiles: await profiles.list(teamId(req)) })),
  );
  router.post(
    '/teams/:teamId/sheet-profiles',
    scoped,
    settings,
    route({ params: teamParamsSchema, body: profileInputSchema }, async ({ body }, req, res) => {
      res.status(201);
      return profiles.create(teamId(req), body);
    }),
  );
  router.put(
    '/teams/:teamId/sheet-profiles/:profileId',
    scoped,
    settings,
    route({ params: profileParamsSchema, body: profileInputSchema }, ({ params, body }, req) =>
      profiles.update(teamId(req), params.profileId, body, false),
    ),
  );
  router.post(
    '/teams/:teamId/sheet-profiles/:profileId/default',
    scoped,
    settings,
    route({ params: profileParamsSchema }, async ({ params }, req) => {
      const profile = await profiles.find(teamId(req), params.profileId);
      return profiles.update(teamId(req), params.profileId, profile, true);
    }),
  );
  router.delete(
    '/teams/:teamId/sheet-profiles/:profileId',
    scoped,
    settings,
    route({ params: profileParamsSchema }, async ({ params }, req, res) => {
      await profiles.remove(teamId(req), params.profileId);
      res.status(204).end();
    }),
  );

  router.get(
    '/teams/:teamId/sheets',
    scoped,
    view,
    route({ params: teamParamsSchema, query: sheetListQuerySchema }, async ({ query }, req) => ({
      sheets: await listExtras(teamId(req), await sheets.list(teamId(req), query)),
    })),
  );
  router.post(
    '/teams/:teamId/sheets',
    scoped,
    edit,
    route({ params: teamParamsSchema, body: sheetCreateSchema }, async ({ body }, req, res) => {
      res.status(201);
      return sheets.create(actorOf(req), body);
    }),
  );
  router.get(
    '/teams/:teamId/sheets/:sheetId',
    scoped,
    view,
    route({ params: sheetParamsSchema }, ({ params }, req) => sheets.detail(teamId(req), params.sheetId)),
  );
  router.put(
    '/teams/:teamId/sheets/:sheetId',
    scoped,
    edit,
    route({ params: sheetParamsSchema, body: sheetSaveSchema }, ({ params, body }, req) => sheets.save(actorOf(req), params.sheetId, body)),
  );
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
      res
        .type('png')
        .set('Cache-Control', 'private, max-age=86400')
        .send(await sheets.thumbnail(teamId(req), params.sheetId));
    }),
  );
  return router;
}
