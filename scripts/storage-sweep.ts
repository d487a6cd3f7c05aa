// npm run storage:sweep: removes stored files no row refers to, older than STORAGE_GRACE_HOURS.
// The server also runs it every six hours; running it by hand is safe at any time.
import { env } from '../server/config/env';
import { createDataSource } from '../server/db/data-source';
import { createStorage } from '../server/storage/create';
import { sweepStorage } from '../server/storage/sweep';

const dataSource = await createDataSource().initialize();
try {
  const report = await sweepStorage(dataSource, createStorage(env), env.STORAGE_GRACE_HOURS * 3_600_000);
  console.log(
    `[sheetsmith] storage sweep: ${report.scanned} files looked at, ${report.deleted} removed, ${report.keptYoung} kept as too recent to judge`,
  );
} finally {
  await dataSource.destroy();
}
