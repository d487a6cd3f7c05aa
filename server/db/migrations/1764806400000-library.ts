import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The art library: collections with licences, keywords, search terms, thumbnails and per-item settings. */
export class Library1764806400000 implements MigrationInterface {
  name = 'Library1764806400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const licence = `
        licence_kind ENUM('personal','commercial','commercial_limited') NULL,
        licence_source VARCHAR(300) NULL,
        licence_notes TEXT NULL,
        licence_unit_limit INT UNSIGNED NULL,
        licence_proof_key CHAR(64) NULL,
        licence_proof_name VARCHAR(200) NULL,`;
    await queryRunner.query(`
      CREATE TABLE collections (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        team_id BIGINT UNSIGNED NOT NULL,
        name VARCHAR(120) NOT NULL,
        position INT NOT NULL DEFAULT 0,
        members_can_add TINYINT(1) NOT NULL DEFAULT 1,
        archived_at DATETIME(3) NULL,${licence}
        created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        KEY ix_collections_team (team_id, position),
        CONSTRAINT fk_collections_team FOREIGN KEY (team_id) REFERENCES teams (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      ALTER TABLE art_items
        ADD COLUMN collection_id BIGINT UNSIGNED NULL AFTER team_id,
        ADD COLUMN thumbnail_key CHAR(64) NULL AFTER storage_key,
        ADD COLUMN background_mode ENUM('auto','keep','colour') NOT NULL DEFAULT 'auto',
        ADD COLUMN background_colour CHAR(7) NULL,
        ADD COLUMN background_tolerance SMALLINT UNSIGNED NOT NULL DEFAULT 32,
        ADD COLUMN licence_kind ENUM('personal','commercial','commercial_limited') NULL,
        ADD COLUMN licence_source VARCHAR(300) NULL,
        ADD COLUMN licence_notes TEXT NULL,
        ADD COLUMN licence_unit_limit INT UNSIGNED NULL,
        ADD COLUMN licence_proof_key CHAR(64) NULL,
        ADD COLUMN licence_proof_name VARCHAR(200) NULL,
        ADD KEY ix_art_items_team_created (team_id, deleted_at, created_at),
        ADD CONSTRAINT fk_art_items_collection FOREIGN KEY (collection_id) REFERENCES collections (id) ON DELETE SET NULL`);
    await queryRunner.query(`
      CREATE TABLE art_keywords (
        art_id BIGINT UNSIGNED NOT NULL,
        keyword VARCHAR(60) NOT NULL,
        PRIMARY KEY (art_id, keyword),
        KEY ix_art_keywords_keyword (keyword),
        CONSTRAINT fk_art_keywords_art FOREIGN KEY (art_id) REFERENCES art_items (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    // Normalised words of an item's name, keywords and collection name, for indexed prefix search.
    await queryRunner.query(`
      CREATE TABLE art_terms (
        team_id BIGINT UNSIGNED NOT NULL,
        art_id BIGINT UNSIGNED NOT NULL,
        term VARCHAR(60) NOT NULL,
        PRIMARY KEY (art_id, term),
        KEY ix_art_terms_lookup (team_id, term),
        CONSTRAINT fk_art_terms_art FOREIGN KEY (art_id) REFERENCES art_items (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS art_terms');
    await queryRunner.query('DROP TABLE IF EXISTS art_keywords');
    await queryRunner.query(`ALTER TABLE art_items DROP FOREIGN KEY fk_art_items_collection, DROP KEY ix_art_items_team_created,
      DROP COLUMN collection_id, DROP COLUMN thumbnail_key, DROP COLUMN background_mode, DROP COLUMN background_colour,
      DROP COLUMN background_tolerance, DROP COLUMN licence_kind, DROP COLUMN licence_source, DROP COLUMN licence_notes,
      DROP COLUMN licence_unit_limit, DROP COLUMN licence_proof_key, DROP COLUMN licence_proof_name`);
    await queryRunner.query('DROP TABLE IF EXISTS collections');
  }
}
