import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

/** The print-shop side: stock, machines and blades, print runs, shop rates, preflight limits, costing per sheet. */
export class PrintShop1765152000000 implements MigrationInterface {
  name = 'PrintShop1765152000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      ALTER TABLE sheet_profiles
        ADD COLUMN smallest_sticker_mm DECIMAL(6,3) NOT NULL DEFAULT 12.700,
        ADD COLUMN min_feature_mm DECIMAL(6,3) NOT NULL DEFAULT 1.000`);
    await queryRunner.query(`
      CREATE TABLE shop_settings (
        team_id BIGINT UNSIGNED NOT NULL,
        currency VARCHAR(4) NOT NULL DEFAULT '$',
        labour_rate DECIMAL(10,2) NOT NULL DEFAULT 0,
        markup_percent DECIMAL(7,1) NOT NULL DEFAULT 100,
        updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        PRIMARY KEY (team_id),
        CONSTRAINT fk_shop_settings_team FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE
      ) ${TABLE}`);
    await queryRunner.query(`
      CREATE TABLE stock_items (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        team_id BIGINT UNSIGNED NOT NULL,
        name VARCHAR(120) NOT NULL,
        finish ENUM('glossy','matte','clear','vinyl','other') NOT NULL,
        paper ENUM('letter','a4','custom') NOT NULL,
        paper_width_mm DECIMAL(8,3) NOT NULL,
        paper_height_mm DECIMAL(8,3) NOT NULL,
        pack_price DECIMAL(10,2) NOT NULL,
        sheets_per_pack INT UNSIGNED NOT NULL,
        on_hand INT NOT NULL DEFAULT 0,
        printer_settings TEXT NOT NULL,
        cutter_settings TEXT NOT NULL,
        rating TINYINT UNSIGNED NULL,
        food_safe TINYINT(1) NOT NULL DEFAULT 0,
        skin_safe TINYINT(1) NOT NULL DEFAULT 0,
        notes TEXT NULL,
        archived_at DATETIME(3) NULL,
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        KEY ix_stock_items_team (team_id),
        CONSTRAINT fk_stock_items_team FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE
      ) ${TABLE}`);
    await queryRunner.query(`
      CREATE TABLE machines (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        team_id BIGINT UNSIGNED NOT NULL,
        kind ENUM('printer','cutter') NOT NULL,
        name VARCHAR(120) NOT NULL,
        notes TEXT NULL,
        ink_full_page DECIMAL(10,4) NULL,
        archived_at DATETIME(3) NULL,
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        KEY ix_machines_team (team_id, kind),
        CONSTRAINT fk_machines_team FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE
      ) ${TABLE}`);
    await queryRunner.query(`
      CREATE TABLE blades (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        team_id BIGINT UNSIGNED NOT NULL,
        cutter_id BIGINT UNSIGNED NOT NULL,
        label VARCHAR(120) NOT NULL,
        fitted_on DATE NOT NULL,
        removed_on DATE NULL,
        cut_length_mm DOUBLE NOT NULL DEFAULT 0,
        life_m DECIMAL(10,1) NOT NULL,
        price DECIMAL(10,2) NOT NULL DEFAULT 0,
        fitted_by BIGINT UNSIGNED NOT NULL,
        note VARCHAR(300) NULL,
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        KEY ix_blades_cutter (cutter_id, removed_on),
        CONSTRAINT fk_blades_cutter FOREIGN KEY (cutter_id) REFERENCES machines (id) ON DELETE CASCADE
      ) ${TABLE}`);
    await queryRunner.query(`
      CREATE TABLE print_runs (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        team_id BIGINT UNSIGNED NOT NULL,
        sheet_id BIGINT UNSIGNED NULL,
        sheet_name VARCHAR(120) NOT NULL,
        sheet_version INT UNSIGNED NOT NULL,
        copies INT UNSIGNED NOT NULL,
        wasted INT UNSIGNED NOT NULL DEFAULT 0,
        stock_id BIGINT UNSIGNED NULL,
        printer_id BIGINT UNSIGNED NULL,
        cutter_id BIGINT UNSIGNED NULL,
        blade_id BIGINT UNSIGNED NULL,
        settings_json TEXT NOT NULL,
        result ENUM('good','misaligned','tore','other') NOT NULL,
        notes TEXT NULL,
        photo_key CHAR(64) NULL,
        cut_length_mm DOUBLE NOT NULL,
        printed_on DATE NOT NULL,
        created_by BIGINT UNSIGNED NOT NULL,
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        KEY ix_print_runs_team (team_id, printed_on),
        CONSTRAINT fk_print_runs_team FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE,
        CONSTRAINT fk_print_runs_sheet FOREIGN KEY (sheet_id) REFERENCES sheets (id) ON DELETE SET NULL,
        CONSTRAINT fk_print_runs_stock FOREIGN KEY (stock_id) REFERENCES stock_items (id) ON DELETE SET NULL,
        CONSTRAINT fk_print_runs_blade FOREIGN KEY (blade_id) REFERENCES blades (id) ON DELETE SET NULL
      ) ${TABLE}`);
    await queryRunner.query(`
      ALTER TABLE sheets
        ADD COLUMN stock_id BIGINT UNSIGNED NULL,
        ADD COLUMN printer_id BIGINT UNSIGNED NULL,
        ADD COLUMN cutter_id BIGINT UNSIGNED NULL,
        ADD COLUMN labour_minutes DECIMAL(6,1) NOT NULL DEFAULT 0,
        ADD COLUMN analysis_json MEDIUMTEXT NULL,
        ADD COLUMN analysis_version INT UNSIGNED NULL`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'ALTER TABLE sheets DROP COLUMN stock_id, DROP COLUMN printer_id, DROP COLUMN cutter_id, DROP COLUMN labour_minutes, DROP COLUMN analysis_json, DROP COLUMN analysis_version',
    );
    for (const table of ['print_runs', 'blades', 'machines', 'stock_items', 'shop_settings'])
      await queryRunner.query(`DROP TABLE IF EXISTS ${table}`);
    await queryRunner.query('ALTER TABLE sheet_profiles DROP COLUMN smallest_sticker_mm, DROP COLUMN min_feature_mm');
  }
}
