import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Art items (team-owned) and the outline cache (keyed by art content and options). */
export class ArtAndOutlines1764720000000 implements MigrationInterface {
  name = 'ArtAndOutlines1764720000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE art_items (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        team_id BIGINT UNSIGNED NOT NULL,
        name VARCHAR(200) NOT NULL,
        sha256 CHAR(64) NOT NULL,
        storage_key CHAR(64) NOT NULL,
        format VARCHAR(10) NOT NULL,
        size_bytes INT UNSIGNED NOT NULL,
        width_px INT UNSIGNED NOT NULL,
        height_px INT UNSIGNED NOT NULL,
        has_transparency TINYINT(1) NOT NULL,
        uploaded_by BIGINT UNSIGNED NOT NULL,
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        deleted_at DATETIME(3) NULL,
        PRIMARY KEY (id),
        UNIQUE KEY uq_art_items_team_sha (team_id, sha256),
        KEY ix_art_items_sha (sha256),
        CONSTRAINT fk_art_items_team FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE,
        CONSTRAINT fk_art_items_user FOREIGN KEY (uploaded_by) REFERENCES users (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE outline_cache (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        cache_key CHAR(64) NOT NULL,
        art_sha256 CHAR(64) NOT NULL,
        options_json TEXT NOT NULL,
        result_json MEDIUMTEXT NOT NULL,
        compute_ms INT UNSIGNED NOT NULL,
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        last_used_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        UNIQUE KEY uq_outline_cache_key (cache_key),
        KEY ix_outline_cache_art (art_sha256)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS outline_cache');
    await queryRunner.query('DROP TABLE IF EXISTS art_items');
  }
}
