import { Router } from 'express';
import multer from 'multer';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { idSchema, teamParamsSchema } from '../../../shared/schemas/team';
import { AppError } from '../../lib/errors';
import { requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { ArtService } from './art.service';
import { artView } from './art.service';

const artParams = z.object({ teamId: idSchema, artId: idSchema });

export function artRouter({ dataSource, art, maxBytes }: { dataSource: DataSource; art: ArtService; maxBytes: number }): Router {
  const router = Router();
  const scoped = teamScope(dataSource);
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 10 } });

  router.get(
    '/teams/:teamId/art',
    scoped,
    requirePermission('team.view'),
    route({ params: teamParamsSchema }, async (_input, req) => ({ items: (await art.list(req.membership!.teamId)).map(artView) })),
  );

  router.post(
    '/teams/:teamId/art',
    scoped,
    requirePermission('library.contribute'),
    upload.single('file'),
    route({ params: teamParamsSchema }, async (_input, req, res) => {
      if (!req.file) throw new AppError(400, 'validation_failed', 'Attach an image in the "file" field.', { file: 'Choose an image to upload' });
      const { item, duplicate } = await art.add(req.membership!.teamId, req.user!.id, req.file);
      res.status(duplicate ? 200 : 201);
      return { item: artView(item), duplicate };
    }),
  );

  router.get(
    '/teams/:teamId/art/:artId',
    scoped,
    requirePermission('team.view'),
    route({ params: artParams }, async ({ params }, req) => artView(await art.get(req.membership!.teamId, params.artId))),
  );

  router.get(
    '/teams/:teamId/art/:artId/file',
    scoped,
    requirePermission('team.view'),
    route({ params: artParams }, async ({ params }, req, res) => {
      const item = await art.get(req.membership!.teamId, params.artId);
      res.type(item.format).set('Cache-Control', 'private, max-age=31536000, immutable').send(await art.bytes(item));
    }),
  );

  return router;
}
