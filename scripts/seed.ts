// Seeds the demo shop, only in demo mode (a laptop: loopback HOST and the local session secret,
// or DEMO=on). Idempotent: each row is looked up first, so a second run adds nothing.
import { createDataSource } from '../server/db/data-source';
import { seedDemo } from '../server/db/demo/seed';
import { env } from '../server/config/env';
import { createStorage } from '../server/storage/create';

if (!env.demoMode) {
  console.log('demo mode is off (DEMO=off, a non-loopback HOST or your own SESSION_SECRET): nothing seeded');
} else {
  const dataSource = await createDataSource().initialize();
  try {
    const added = await seedDemo(dataSource, createStorage(env));
    console.log(added > 0 ? `demo shop: added ${added} rows` : 'demo shop already seeded');
  } finally {
    await dataSource.destroy();
  }
}
