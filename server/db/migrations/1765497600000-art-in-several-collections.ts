import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Art may sit in several collections (a join table), and its licence no longer follows whichever
 * collection it is in: it carries its own, or its pack's, the collection it was uploaded into
 * (`pack_id`). Existing art keeps what it showed: its collection becomes both its one membership
 * and its pack.
 */
export class ArtInSeveralCollections1765497600000 implements MigrationInterface {
  name = 'ArtInSeveralCollections1765497600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE art_collections (
        art_id BIGINT UNSIGNED NOT NULL,
        collection_id BIGINT UNSIGNED NOT NULL,
        added_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        PRIMARY KEY (art_id, collection_id),
        KEY ix_art_collections_collection (collection_id, art_id),
        CONSTRAINT fk_art_collections_art FOREIGN KEY (art_id) REFERENCES art_items (id) ON DELETE CASCADE,
        CONSTRAINT fk_art_collections_collection FOREIGN KEY (collection_id) REFERENCES collections (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(
      'INSERT INTO art_collections (art_id, collection_id) SELECT id, collection_id FROM art_items WHERE collection_id IS NOT NULL',
    );
    await queryRunner.query(`
      ALTER TABLE art_items
        ADD COLUMN pack_id BIGINT UNSIGNED NULL AFTER team_id,
        ADD CONSTRAINT fk_art_items_pack FOREIGN KEY (pack_id) REFERENCES collections (id) ON DELETE SET NULL`);
    await queryRunner.query('UPDATE art_items SET pack_id = collection_id');
    await queryRunner.query('ALTER TABLE art_items DROP FOREIGN KEY fk_art_items_collection');
    await queryRunner.query('ALTER TABLE art_items DROP COLUMN collection_id');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE art_items ADD COLUMN collection_id BIGINT UNSIGNED NULL AFTER team_id');
    await queryRunner.query(
      'UPDATE art_items a SET collection_id = (SELECT MIN(collection_id) FROM art_collections m WHERE m.art_id = a.id)',
    );
    await queryRunner.query(
      'ALTER TABLE art_items ADD CONSTRAINT fk_art_items_collection FOREIGN KEY (collection_id) REFERENCES collections (id) ON DELETE SET NULL',
    );
    await queryRunner.query('ALTER TABLE art_items DROP FOREIGN KEY fk_art_items_pack, DROP COLUMN pack_id');
    await queryRunner.query('DROP TABLE art_collections');
  }
}
