import { Router } from 'express';
import { PROOF_LIMITS, singleUpload } from '../../middleware/uploads';
import type { DataSource } from 'typeorm';
import { collectionCreateSchema, collectionOrderSchema, collectionParamsSchema, collectionUpdateSchema } from '@shared/schemas/library';
import { teamParamsSchema } from '@shared/schemas/team';
import { AppError } from '../../lib/errors';
import { requirePermission, teamScope } from '../../middleware/auth';
import { route } from '../../middleware/validate';
import type { CollectionsService } from './collections.service';

export function collectionsRouter({ dataSource, collections }: { dataSource: DataSource; collections: CollectionsService }): Router {
  const router = Router();
  const scoped = teamScope(dataSource);
  const manage = requirePermission('library.manage');
  const proofUpload = singleUpload('file', PROOF_LIMITS);

  router.get(
    '/teams/:teamId/collections',
    scoped,
    requirePermission('team.view'),
    route({ params: teamParamsSchema }, async (_i, req) => ({ collections: await collections.list(req.membership!.teamId) })),
  );
  router.post(
    '/teams/:teamId/collections',
    scoped,
    manage,
    route({ params: teamParamsSchema, body: collectionCreateSchema }, async ({ body }, req, res) => {
      res.status(201);
      return collections.create(req.membership!.teamId, body);
    }),
  );
  router.put(
    '/teams/:teamId/collections/order',
    scoped,
    manage,
    route({ params: teamParamsSchema, body: collectionOrderSchema }, async ({ body }, req) => ({
      collections: await collections.reorder(req.membership!.teamId, body.ids),
    })),
  );
  router.patch(
    '/teams/:teamId/collections/:collectionId',
    scoped,
    manage,
    route({ params: collectionParamsSchema, body: collectionUpdateSchema }, ({ params, body }, req) =>
      collections.update(req.membership!.teamId, params.collectionId, body),
    ),
  );
  router.post(
    '/teams/:teamId/collections/:collectionId/licence-proof',
    scoped,
    manage,
    proofUpload,
    route({ params: collectionParamsSchema }, ({ params }, req) => {
      if (!req.file) throw new AppError(400, 'validation_failed', 'Attach the proof file.', { file: 'Choose a file' });
      return collections.attachProof(req.membership!.teamId, params.collectionId, req.file);
    }),
  );
  router.get(
    '/teams/:teamId/collections/:collectionId/licence-proof',
    scoped,
    requirePermission('team.view'),
    route({ params: collectionParamsSchema }, async ({ params }, req, res) => {
      const proof = await collections.proof(req.membership!.teamId, params.collectionId);
      res.attachment(proof.name).send(proof.data);
    }),
  );
  return router;
}
