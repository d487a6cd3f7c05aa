import { Column, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm';
import { decimal } from '../../db/columns';

/** A team's shop rates: currency, labour, markup and waste allowance. */
@Entity({ name: 'shop_settings' })
export class ShopSettingsRow {
  @PrimaryColumn({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ type: 'varchar', length: 4, default: '$' })
  currency!: string;

  @Column({ name: 'labour_rate', ...decimal(10, 2), default: 0 })
  labourRate!: number;

  @Column({ name: 'markup_percent', ...decimal(7, 1), default: 100 })
  markupPercent!: number;

  @Column({ name: 'waste_percent', ...decimal(5, 1), default: 0 })
  wastePercent!: number;

  /** What sheets without their own choice (and no run of their own) are costed on. */
  @Column({ name: 'default_stock_id', type: 'bigint', unsigned: true, nullable: true })
  defaultStockId!: string | null;

  @Column({ name: 'default_printer_id', type: 'bigint', unsigned: true, nullable: true })
  defaultPrinterId!: string | null;

  @Column({ name: 'default_cutter_id', type: 'bigint', unsigned: true, nullable: true })
  defaultCutterId!: string | null;

  /** ISO 4217 code buyers pay in (orders keep the one they were quoted in). */
  @Column({ name: 'currency_code', type: 'char', length: 3, default: 'USD' })
  currencyCode!: string;

  /** Whether viewers see prices and payments on orders. */
  @Column({ name: 'viewers_see_prices', type: 'boolean', default: true })
  viewersSeePrices!: boolean;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
