import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The stock, printer and cutter a team usually prints with: what sheets without their own choice are costed on. */
export class ShopDefaults1766016000000 implements MigrationInterface {
  name = 'ShopDefaults1766016000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'ALTER TABLE shop_settings ADD COLUMN default_stock_id BIGINT UNSIGNED NULL, ADD COLUMN default_printer_id BIGINT UNSIGNED NULL, ADD COLUMN default_cutter_id BIGINT UNSIGNED NULL',
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'ALTER TABLE shop_settings DROP COLUMN default_cutter_id, DROP COLUMN default_printer_id, DROP COLUMN default_stock_id',
    );
  }
}
