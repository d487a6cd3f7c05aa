import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The shop's waste allowance in costs, a low-stock mark per stock and a replace-by date per blade. */
export class ShopAllowances1765929600000 implements MigrationInterface {
  name = 'ShopAllowances1765929600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE shop_settings ADD COLUMN waste_percent DECIMAL(5,1) NOT NULL DEFAULT 0');
    await queryRunner.query('ALTER TABLE stock_items ADD COLUMN low_at INT UNSIGNED NULL');
    await queryRunner.query('ALTER TABLE blades ADD COLUMN replace_by DATE NULL');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE blades DROP COLUMN replace_by');
    await queryRunner.query('ALTER TABLE stock_items DROP COLUMN low_at');
    await queryRunner.query('ALTER TABLE shop_settings DROP COLUMN waste_percent');
  }
}
