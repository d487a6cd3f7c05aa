import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Sheet profiles gain the bridge width (parts of the art joined by the border), the PDF cut layer's
 * spot colour name and optional registration marks; art gains the maker's "widen narrow parts" choice.
 */
export class CutBridgesAndMarks1765670400000 implements MigrationInterface {
  name = 'CutBridgesAndMarks1765670400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE sheet_profiles
         ADD COLUMN bridge_width_mm DECIMAL(6,3) NOT NULL DEFAULT 3,
         ADD COLUMN spot_colour VARCHAR(40) NOT NULL DEFAULT 'CutContour',
         ADD COLUMN reg_mark_shape ENUM('none','square','dot','bracket') NOT NULL DEFAULT 'none',
         ADD COLUMN reg_mark_size_mm DECIMAL(6,3) NOT NULL DEFAULT 5,
         ADD COLUMN reg_mark_offset_mm DECIMAL(6,3) NOT NULL DEFAULT 5`,
    );
    await queryRunner.query('ALTER TABLE art_items ADD COLUMN widen_necks BOOLEAN NOT NULL DEFAULT FALSE');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE art_items DROP COLUMN widen_necks');
    await queryRunner.query(
      'ALTER TABLE sheet_profiles DROP COLUMN reg_mark_offset_mm, DROP COLUMN reg_mark_size_mm, DROP COLUMN reg_mark_shape, DROP COLUMN spot_colour, DROP COLUMN bridge_width_mm',
    );
  }
}
