import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { Router } from 'express';
import { z } from 'zod';
import { notFound } from '../../lib/errors';
import { listOutbox } from '../../mail/mailer';
import { route } from '../../middleware/validate';

const fileParams = z.object({ file: z.string().regex(/^[A-Za-z0-9_.-]+\.eml$/, 'Not an outbox file') });

/** Development only: the e-mails the fake mailer wrote, so invites and resets can be followed. */
export function outboxRouter(dir: string): Router {
  const router = Router();
  router.get(
    '/dev/outbox',
    route({}, async () => ({ messages: await listOutbox(dir) })),
  );
  router.get(
    '/dev/outbox/:file',
    route({ params: fileParams }, async ({ params }, _req, res) => {
      try {
        const text = await readFile(path.join(dir, path.basename(params.file)), 'utf8');
        res.type('text/plain').send(text);
      } catch {
        throw notFound('That message');
      }
    }),
  );
  return router;
}
