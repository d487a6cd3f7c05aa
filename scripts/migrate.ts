// Runs every pending TypeORM migration against DB_NAME.
import { createDataSource } from '../server/db/data-source';

const dataSource = await createDataSource().initialize();
try {
  const ran = await dataSource.runMigrations({ transaction: 'each' });
  console.log(ran.length ? `applied ${ran.map((m) => m.name).join(', ')}` : 'database schema is up to date');
} finally {
  await dataSource.destroy();
}
