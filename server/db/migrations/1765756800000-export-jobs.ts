import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Exports run as queue jobs, perhaps on another machine and perhaps after the sheet changed again:
 * the row keeps the document and the preflight findings it was started with.
 */
export class ExportJobs1765756800000 implements MigrationInterface {
  name = 'ExportJobs1765756800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    // queue_prefix: the queue the job went to; only apps of that queue may end the row for a lost job.
    await queryRunner.query(
      'ALTER TABLE sheet_exports ADD COLUMN document_json MEDIUMTEXT NULL, ADD COLUMN findings_json MEDIUMTEXT NULL, ADD COLUMN attempts SMALLINT UNSIGNED NOT NULL DEFAULT 0, ADD COLUMN queue_prefix VARCHAR(100) NULL',
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'ALTER TABLE sheet_exports DROP COLUMN queue_prefix, DROP COLUMN attempts, DROP COLUMN findings_json, DROP COLUMN document_json',
    );
  }
}
