import { Router } from 'express';
import type { DataSource } from 'typeorm';

export function healthRouter(dataSource: DataSource): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    // Raw on purpose: the cheapest round trip that proves the database answers, no table involved.
    const database: 'up' | 'down' = await dataSource.query('SELECT 1').then(
      () => 'up',
      () => 'down',
    );
    if (database === 'down') res.set('Retry-After', '5');
    res.status(database === 'up' ? 200 : 503).json({ app: 'up', database, time: new Date().toISOString() });
  });
  return router;
}
