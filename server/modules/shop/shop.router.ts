import { Router } from 'express';
import type { Request } from 'express';
import { singleUpload } from '../../middleware/uploads';
import { outlineAccess } from '../outlines/outline.service';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import {
  bladeFitSchema,
  costingInputSchema,
  machineInputSchema,
  printRunInputSchema,
  runListQuerySchema,
  shopSettingsSchema,
  stockAdjustSchema,
  stockInputSchema,
} from '@shared/schemas/shop';
import { sheetParamsSchema } from '@shared/schemas/sheets';
import { idSchema, teamParamsSchema } from '@shared/schemas/team';
import { AppError } from '../../lib/errors';
import { requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { SheetsService } from '../sheets/sheets.service';
import type { CostingService } from './costing.service';
import type { MachinesService } from './machines.service';
import type { RunsService } from './runs.service';
import type { SheetAnalysisService } from './sheet-analysis.service';
import type { StockService } from './stock.service';

const itemParams = z.object({ teamId: idSchema, id: idSchema });

/** The print shop: shop rates, stock, machines and blades, print runs, and each sheet's preflight and cost. */
export function shopRouter(deps: {
  dataSource: DataSource;
  sheets: SheetsService;
  stock: StockService;
  machines: MachinesService;
  runs: RunsService;
  costing: CostingService;
  analysis: SheetAnalysisService;
}): Router {
  const { stock, machines, runs, costing, analysis, sheets } = deps;
  const router = Router();
  const scoped = teamScope(deps.dataSource);
  const view = requirePermission('team.view');
  const record = requirePermission('shop.record');
  const manage = requirePermission('shop.manage');
  const teamId = (req: Request) => req.membership!.teamId;
  const created = <T>(res: { status: (n: number) => unknown }, value: T) => (res.status(201), value);
  const photoUpload = singleUpload('photo', { maxBytes: 15 * 1024 * 1024, fields: 5, fieldBytes: 1024 });

  router.get(
    '/teams/:teamId/shop-settings',
    scoped,
    view,
    route({ params: teamParamsSchema }, (_i, req) => costing.settings(teamId(req))),
  );
  router.put(
    '/teams/:teamId/shop-settings',
    scoped,
    manage,
    route({ params: teamParamsSchema, body: shopSettingsSchema }, ({ body }, req) => costing.saveSettings(teamId(req), body)),
  );

  router.get(
    '/teams/:teamId/stock',
    scoped,
    view,
    route({ params: teamParamsSchema }, async (_i, req) => ({ stock: await stock.list(teamId(req)) })),
  );
  router.post(
    '/teams/:teamId/stock',
    scoped,
    manage,
    route({ params: teamParamsSchema, body: stockInputSchema }, async ({ body }, req, res) =>
      created(res, await stock.create(teamId(req), body)),
    ),
  );
  router.put(
    '/teams/:teamId/stock/:id',
    scoped,
    manage,
    route({ params: itemParams, body: stockInputSchema }, ({ params, body }, req) => stock.update(teamId(req), params.id, body)),
  );
  router.post(
    '/teams/:teamId/stock/:id/adjust',
    scoped,
    record,
    route({ params: itemParams, body: stockAdjustSchema }, ({ params, body }, req) =>
      stock.adjust(teamId(req), params.id, body.change, body.confirmNegative),
    ),
  );
  router.delete(
    '/teams/:teamId/stock/:id',
    scoped,
    manage,
    route({ params: itemParams }, async ({ params }, req, res) => {
      await stock.archive(teamId(req), params.id);
      res.status(204).end();
    }),
  );

  router.get(
    '/teams/:teamId/machines',
    scoped,
    view,
    route({ params: teamParamsSchema }, async (_i, req) => ({ machines: await machines.list(teamId(req)) })),
  );
  router.post(
    '/teams/:teamId/machines',
    scoped,
    manage,
    route({ params: teamParamsSchema, body: machineInputSchema }, async ({ body }, req, res) =>
      created(res, await machines.create(teamId(req), body)),
    ),
  );
  router.put(
    '/teams/:teamId/machines/:id',
    scoped,
    manage,
    route({ params: itemParams, body: machineInputSchema }, ({ params, body }, req) => machines.update(teamId(req), params.id, body)),
  );
  router.delete(
    '/teams/:teamId/machines/:id',
    scoped,
    manage,
    route({ params: itemParams }, async ({ params }, req, res) => {
      await machines.archive(teamId(req), params.id);
      res.status(204).end();
    }),
  );
  router.post(
    '/teams/:teamId/machines/:id/blades',
    scoped,
    record,
    route({ params: itemParams, body: bladeFitSchema }, async ({ params, body }, req, res) =>
      created(res, await machines.fitBlade(teamId(req), params.id, req.user!.id, body)),
    ),
  );

  router.get(
    '/teams/:teamId/print-runs',
    scoped,
    view,
    route({ params: teamParamsSchema, query: runListQuerySchema }, async ({ query }, req) => ({
      runs: await runs.list(teamId(req), query),
    })),
  );
  router.post(
    '/teams/:teamId/print-runs',
    scoped,
    record,
    route({ params: teamParamsSchema, body: printRunInputSchema }, async ({ body }, req, res) =>
      created(res, await runs.record(teamId(req), req.user!.id, body)),
    ),
  );
  router.get(
    '/teams/:teamId/print-runs/:id/photo',
    scoped,
    view,
    route({ params: itemParams }, async ({ params }, req, res) => {
      res
        .type('jpeg')
        .set('Cache-Control', 'private, max-age=86400')
        .send(await runs.photo(teamId(req), params.id));
    }),
  );
  router.post(
    '/teams/:teamId/print-runs/:id/photo',
    scoped,
    record,
    photoUpload,
    route({ params: itemParams }, ({ params }, req) => {
      if (!req.file) throw new AppError(400, 'validation_failed', 'Attach a photo.', { photo: 'Choose a photo' });
      return runs.attachPhoto(teamId(req), params.id, req.file.buffer);
    }),
  );

  router.get(
    '/teams/:teamId/sheets/:sheetId/analysis',
    scoped,
    view,
    route({ params: sheetParamsSchema }, async ({ params }, req) =>
      analysis.analyse(teamId(req), await sheets.find(teamId(req), params.sheetId), outlineAccess(req.membership!.role)),
    ),
  );
  router.get(
    '/teams/:teamId/sheets/:sheetId/cost',
    scoped,
    view,
    route({ params: sheetParamsSchema }, ({ params }, req) =>
      costing.cost(teamId(req), params.sheetId, outlineAccess(req.membership!.role)),
    ),
  );
  router.put(
    '/teams/:teamId/sheets/:sheetId/costing',
    scoped,
    requirePermission('sheets.edit'),
    route({ params: sheetParamsSchema, body: costingInputSchema }, ({ params, body }, req) =>
      costing.setCosting(teamId(req), params.sheetId, body),
    ),
  );
  return router;
}
