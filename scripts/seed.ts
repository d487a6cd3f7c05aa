// Seeds the demo shop. Idempotent: each row is looked up first, so a second run adds nothing.
import { createDataSource } from '../server/db/data-source';
import { seedDemo } from '../server/db/seed-demo';
import { env } from '../server/config/env';
import { LocalDiskStorage } from '../server/storage/local-disk';

const dataSource = await createDataSource().initialize();
try {
  const added = await seedDemo(dataSource, new LocalDiskStorage(env.storageDir));
  console.log(added > 0 ? `demo shop: added ${added} rows` : 'demo shop already seeded');
} finally {
  await dataSource.destroy();
}
