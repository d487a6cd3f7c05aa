// Runs once before all suites: brings the (freshly recreated) test database to the latest schema
// with the same migrations production uses. scripts/test.sh recreated the database just before.
import { createDataSource } from '../../server/db/data-source';

export default async function setup() {
  if (process.env.NODE_ENV !== 'test' || !/test/.test(process.env.DB_NAME ?? '')) {
    throw new Error('Run the suites with `npm test`: it points them at the separate test database.');
  }
  const dataSource = await createDataSource().initialize();
  try {
    await dataSource.runMigrations({ transaction: 'each' });
  } finally {
    await dataSource.destroy();
  }
}
