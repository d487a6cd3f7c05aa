import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Art drawn from vector files keeps its (cleaned) source beside the PNG drawn at the print DPI. */
export class VectorArtSources1765843200000 implements MigrationInterface {
  name = 'VectorArtSources1765843200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE art_items ADD COLUMN source_key CHAR(64) NULL, ADD COLUMN source_format VARCHAR(10) NULL');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE art_items DROP COLUMN source_format, DROP COLUMN source_key');
  }
}
