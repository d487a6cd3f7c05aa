import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The files inside each finished export bundle (name and size), so each can be downloaded alone. */
export class ExportFiles1765584000000 implements MigrationInterface {
  name = 'ExportFiles1765584000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE sheet_exports ADD COLUMN files_json TEXT NULL');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE sheet_exports DROP COLUMN files_json');
  }
}
