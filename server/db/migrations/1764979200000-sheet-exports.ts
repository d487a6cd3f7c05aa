import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Export jobs: one row per run, the bundle kept in storage for its sheet version. */
export class SheetExports1764979200000 implements MigrationInterface {
  name = 'SheetExports1764979200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE sheet_exports (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        team_id BIGINT UNSIGNED NOT NULL,
        sheet_id BIGINT UNSIGNED NOT NULL,
        sheet_version INT UNSIGNED NOT NULL,
        status ENUM('running','done','failed') NOT NULL,
        progress DECIMAL(4,3) NOT NULL DEFAULT 0,
        step VARCHAR(120) NOT NULL DEFAULT '',
        error VARCHAR(500) NULL,
        options_json TEXT NOT NULL,
        zip_key CHAR(64) NULL,
        zip_name VARCHAR(120) NULL,
        created_by BIGINT UNSIGNED NOT NULL,
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        KEY ix_sheet_exports_sheet (sheet_id, sheet_version),
        CONSTRAINT fk_sheet_exports_sheet FOREIGN KEY (sheet_id) REFERENCES sheets (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS sheet_exports');
  }
}
