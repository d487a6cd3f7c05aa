import type { OutlineResponse } from '@shared/schemas/outline';
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { outlineQuerySchema, removalPreviewQuerySchema } from '@shared/schemas/outline';
import { idSchema } from '@shared/schemas/team';
import { requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { ArtService } from '../art/art.service';
import type { OutlineService } from './outline.service';
import { outlineAccess, withArtSetting } from './outline.service';

const artParams = z.object({ teamId: idSchema, artId: idSchema });
const pieceParams = z.object({
  teamId: idSchema,
  key: z.string().regex(/^[0-9a-f]{64}$/, 'Not an outline key'),
  index: z.coerce.number().int().min(0).max(999),
});

/**
 * GET /api/teams/:teamId/art/:artId/outline?width=2in&border=3mm&… computes (or fetches from the
 * cache) the outline of one art item; each piece's bordered PNG is at its `pngUrl`.
 */
export function outlinesRouter({
  dataSource,
  art,
  outlines,
}: {
  dataSource: DataSource;
  art: ArtService;
  outlines: OutlineService;
}): Router {
  const router = Router();
  const scoped = teamScope(dataSource);

  router.get(
    '/teams/:teamId/art/:artId/outline',
    scoped,
    requirePermission('team.view'),
    route({ params: artParams, query: outlineQuerySchema }, async ({ params, query }, req): Promise<OutlineResponse> => {
      const teamId = req.membership!.teamId;
      const item = await art.find(teamId, params.artId);
      const options = withArtSetting(item, query, {
        background: req.query.background !== undefined,
        widenNecks: req.query.widenNecks !== undefined,
      });
      const { key, cached, outline } = await outlines.forArt(item, options, outlineAccess(req.membership!.role));
      return {
        key,
        cached,
        artId: item.id,
        ...outline,
        pieces: outline.pieces.map(({ pngKey: _pngKey, ...piece }, index) => ({
          ...piece,
          index,
          pngUrl: `/api/teams/${teamId}/outlines/${key}/pieces/${index}.png`,
        })),
      };
    }),
  );

  // What background removal takes from the art at a mode and tolerance, tinted over the original.
  router.get(
    '/teams/:teamId/art/:artId/background-removal.png',
    scoped,
    requirePermission('team.view'),
    route({ params: artParams, query: removalPreviewQuerySchema }, async ({ params, query }, req, res) => {
      const item = await art.find(req.membership!.teamId, params.artId);
      const preview = await outlines.removalPreview(item, query, outlineAccess(req.membership!.role));
      res.type('png').set('Cache-Control', 'private, max-age=3600').set('X-Art-Taken', preview.takenShare.toFixed(4)).send(preview.png);
    }),
  );

  router.get(
    '/teams/:teamId/outlines/:key/pieces/:index.png',
    scoped,
    requirePermission('team.view'),
    route({ params: pieceParams }, async ({ params }, req, res) => {
      const png = await outlines.piecePng(req.membership!.teamId, params.key, params.index);
      res.type('png').set('Cache-Control', 'private, max-age=31536000, immutable').send(png);
    }),
  );

  return router;
}
