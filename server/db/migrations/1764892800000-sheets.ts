import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Sheet profiles (paper, print area, margins), sheets with a versioned document, and art used by sheets. */
export class Sheets1764892800000 implements MigrationInterface {
  name = 'Sheets1764892800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE sheet_profiles (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        team_id BIGINT UNSIGNED NOT NULL,
        name VARCHAR(80) NOT NULL,
        paper ENUM('letter','a4','custom') NOT NULL,
        paper_width_mm DECIMAL(8,3) NOT NULL,
        paper_height_mm DECIMAL(8,3) NOT NULL,
        area_width_mm DECIMAL(8,3) NOT NULL,
        area_height_mm DECIMAL(8,3) NOT NULL,
        area_x_mm DECIMAL(8,3) NOT NULL,
        area_y_mm DECIMAL(8,3) NOT NULL,
        safe_margin_mm DECIMAL(6,3) NOT NULL,
        min_gap_mm DECIMAL(6,3) NOT NULL,
        is_default TINYINT(1) NOT NULL DEFAULT 0,
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        KEY ix_sheet_profiles_team (team_id),
        CONSTRAINT fk_sheet_profiles_team FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE sheets (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        team_id BIGINT UNSIGNED NOT NULL,
        owner_id BIGINT UNSIGNED NOT NULL,
        profile_id BIGINT UNSIGNED NULL,
        name VARCHAR(120) NOT NULL,
        unit ENUM('in','mm') NOT NULL DEFAULT 'in',
        status ENUM('draft','ready','printed') NOT NULL DEFAULT 'draft',
        for_sale TINYINT(1) NOT NULL DEFAULT 0,
        notes TEXT NULL,
        version INT UNSIGNED NOT NULL DEFAULT 1,
        document MEDIUMTEXT NOT NULL,
        is_template TINYINT(1) NOT NULL DEFAULT 0,
        piece_count INT UNSIGNED NOT NULL DEFAULT 0,
        area_used DECIMAL(6,5) NOT NULL DEFAULT 0,
        thumbnail_key CHAR(64) NULL,
        updated_by BIGINT UNSIGNED NULL,
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        KEY ix_sheets_team (team_id, is_template, updated_at),
        CONSTRAINT fk_sheets_team FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE,
        CONSTRAINT fk_sheets_owner FOREIGN KEY (owner_id) REFERENCES users (id),
        CONSTRAINT fk_sheets_profile FOREIGN KEY (profile_id) REFERENCES sheet_profiles (id) ON DELETE SET NULL
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE sheet_art (
        sheet_id BIGINT UNSIGNED NOT NULL,
        art_id BIGINT UNSIGNED NOT NULL,
        PRIMARY KEY (sheet_id, art_id),
        KEY ix_sheet_art_art (art_id),
        CONSTRAINT fk_sheet_art_sheet FOREIGN KEY (sheet_id) REFERENCES sheets (id) ON DELETE CASCADE,
        CONSTRAINT fk_sheet_art_art FOREIGN KEY (art_id) REFERENCES art_items (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['sheet_art', 'sheets', 'sheet_profiles']) await queryRunner.query(`DROP TABLE IF EXISTS ${table}`);
  }
}
