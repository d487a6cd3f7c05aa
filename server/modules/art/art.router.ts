import { Router } from 'express';
import { PROOF_LIMITS, singleUpload } from '../../middleware/uploads';
import type { DataSource } from 'typeorm';
import { artListQuerySchema, artParamsSchema, artUpdateSchema, bulkActionSchema, uploadFieldsSchema } from '@shared/schemas/library';
import { teamParamsSchema } from '@shared/schemas/team';
import { AppError, notFound } from '../../lib/errors';
import { actorOf, requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { ArtService } from './art.service';
import { searchArt } from './art-search';
import { madeArtSvg } from './made-art';
import { madeArtSchema } from '@shared/schemas/made-art';
import { TeamVocabularies } from './vocabulary';
import { z } from 'zod';

/** Names of the team's sheets that use any of the art (sheets sit above art and are asked through this). */
type SheetsUsingArt = (teamId: string, artIds: string[]) => Promise<string[]>;

export function artRouter({
  dataSource,
  art,
  sheetsUsing,
  maxBytes,
}: {
  dataSource: DataSource;
  art: ArtService;
  sheetsUsing: SheetsUsingArt;
  maxBytes: number;
}): Router {
  const router = Router();
  const vocabularies = new TeamVocabularies(dataSource);
  const scoped = teamScope(dataSource);
  const upload = singleUpload('file', { maxBytes, fields: 20, fieldBytes: 16 * 1024 });
  const proofUpload = singleUpload('file', PROOF_LIMITS);
  const view = requirePermission('team.view');
  const contribute = requirePermission('library.contribute');

  router.get(
    '/teams/:teamId/art',
    scoped,
    view,
    route({ params: teamParamsSchema, query: artListQuerySchema }, ({ query }, req) =>
      searchArt(dataSource, vocabularies, req.membership!.teamId, query),
    ),
  );

  // One file per request (an image or a zip of a pack), so the client can show progress per file.
  router.post(
    '/teams/:teamId/art',
    scoped,
    contribute,
    upload,
    route({ params: teamParamsSchema, body: uploadFieldsSchema }, async ({ body }, req, res) => {
      if (!req.file)
        throw new AppError(400, 'validation_failed', 'Attach an image or a zip in the "file" field.', { file: 'Choose a file to upload' });
      const results = await art.upload(actorOf(req), req.file, body);
      res.status(results.some((r) => r.status === 'stored') ? 201 : 200);
      return { results };
    }),
  );

  // Stickers made from words or a shape: drawn as an SVG here and stored like an uploaded one.
  router.post(
    '/teams/:teamId/art/made/preview',
    scoped,
    contribute,
    route({ params: teamParamsSchema, body: madeArtSchema }, ({ body }) => ({ svg: madeArtSvg(body) })),
  );
  router.post(
    '/teams/:teamId/art/made',
    scoped,
    contribute,
    route({ params: teamParamsSchema, body: madeArtSchema }, async ({ body }, req, res) => {
      const file = { originalname: `${body.name}.svg`, buffer: Buffer.from(madeArtSvg(body)) };
      const results = await art.upload(actorOf(req), file, { keywords: body.keywords, collectionId: body.collectionId });
      res.status(results.some((r) => r.status === 'stored') ? 201 : 200);
      return { results };
    }),
  );

  router.post(
    '/teams/:teamId/art/bulk',
    scoped,
    contribute,
    route({ params: teamParamsSchema, body: bulkActionSchema }, async ({ body }, req) => {
      if (body.action === 'delete' && !body.confirm) {
        const usedBy = await sheetsUsing(req.membership!.teamId, body.ids);
        if (usedBy.length)
          throw new AppError(
            409,
            'art_in_use',
            `Some of this art is on ${usedBy.length} sheet${usedBy.length === 1 ? '' : 's'} (${usedBy.slice(0, 3).join(', ')}${usedBy.length > 3 ? ', …' : ''}). Delete it anyway? Those sheets keep their copy.`,
          );
      }
      return art.bulk(actorOf(req), body);
    }),
  );

  router.get(
    '/teams/:teamId/art/:artId',
    scoped,
    view,
    route({ params: artParamsSchema }, ({ params }, req) => art.view(req.membership!.teamId, params.artId)),
  );

  router.patch(
    '/teams/:teamId/art/:artId',
    scoped,
    contribute,
    route({ params: artParamsSchema, body: artUpdateSchema }, ({ params, body }, req) => art.update(actorOf(req), params.artId, body)),
  );

  router.delete(
    '/teams/:teamId/art/:artId',
    scoped,
    contribute,
    route({ params: artParamsSchema, query: z.object({ confirm: z.enum(['1']).optional() }) }, async ({ params, query }, req, res) => {
      const item = await art.find(req.membership!.teamId, params.artId);
      // Art on sheets is asked about first; deleting it then keeps those sheets printable.
      const usedBy = await sheetsUsing(req.membership!.teamId, [item.id]);
      if (usedBy.length > 0 && !query.confirm) {
        throw new AppError(
          409,
          'art_in_use',
          `“${item.name}” is on ${usedBy.length} sheet${usedBy.length === 1 ? '' : 's'} (${usedBy.slice(0, 3).join(', ')}${usedBy.length > 3 ? ', …' : ''}). Delete it anyway? Those sheets keep their copy.`,
          { sheets: usedBy.join(', ') },
        );
      }
      await art.remove(actorOf(req), [item]);
      res.status(204).end();
    }),
  );

  const sendStored = (kind: 'file' | 'thumbnail' | 'licence-proof' | 'source') =>
    route({ params: artParamsSchema }, async ({ params }, req, res) => {
      const item = await art.find(req.membership!.teamId, params.artId);
      const keys = { file: item.storageKey, thumbnail: item.thumbnailKey, 'licence-proof': item.licence.proofKey, source: item.sourceKey };
      const key = keys[kind];
      const missing = {
        file: 'That file',
        thumbnail: 'That thumbnail',
        'licence-proof': 'That licence proof',
        source: 'A vector original',
      };
      if (!key) throw notFound(missing[kind]);
      if (kind === 'licence-proof') res.attachment(item.licence.proofName ?? 'licence-proof');
      // The vector original is always a download, never shown inline, so it cannot run in the app's origin.
      else if (kind === 'source') res.attachment(`${item.name}.svg`).type('image/svg+xml');
      else res.type(kind === 'file' ? item.format : 'webp');
      res.set('Cache-Control', 'private, max-age=86400').send(await art.bytes(key));
    });
  router.get('/teams/:teamId/art/:artId/file', scoped, view, sendStored('file'));
  router.get('/teams/:teamId/art/:artId/thumbnail', scoped, view, sendStored('thumbnail'));
  router.get('/teams/:teamId/art/:artId/licence-proof', scoped, view, sendStored('licence-proof'));
  router.get('/teams/:teamId/art/:artId/source', scoped, view, sendStored('source'));

  router.post(
    '/teams/:teamId/art/:artId/licence-proof',
    scoped,
    requirePermission('library.manage'),
    proofUpload,
    route({ params: artParamsSchema }, ({ params }, req) => {
      if (!req.file) throw new AppError(400, 'validation_failed', 'Attach the proof file.', { file: 'Choose a file' });
      return art.attachProof(actorOf(req), params.artId, req.file);
    }),
  );

  return router;
}
