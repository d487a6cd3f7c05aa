// Seeds the demo shop. Idempotent: each row is looked up first, so a second run adds nothing.
import { createDataSource } from '../server/db/data-source';
import { seedDemo } from '../server/db/seed-demo';

const dataSource = await createDataSource().initialize();
try {
  const added = await seedDemo(dataSource);
  console.log(added > 0 ? `demo shop: added ${added} rows` : 'demo shop already seeded');
} finally {
  await dataSource.destroy();
}
