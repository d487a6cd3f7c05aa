import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { StockInput } from '@shared/schemas/shop';
import { decimal } from '../../db/columns';

/** A stock the team prints on: its price, the sheets on hand and the settings that worked. */
@Entity({ name: 'stock_items' })
export class StockItem {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @Column({ type: 'enum', enum: ['glossy', 'matte', 'clear', 'vinyl', 'other'] })
  finish!: StockInput['finish'];

  @Column({ type: 'enum', enum: ['letter', 'a4', 'custom'] })
  paper!: StockInput['paper'];

  @Column({ name: 'paper_width_mm', ...decimal(8, 3) })
  paperWidthMm!: number;

  @Column({ name: 'paper_height_mm', ...decimal(8, 3) })
  paperHeightMm!: number;

  @Column({ name: 'pack_price', ...decimal(10, 2) })
  packPrice!: number;

  @Column({ name: 'sheets_per_pack', type: 'int', unsigned: true })
  sheetsPerPack!: number;

  @Column({ name: 'on_hand', type: 'int', default: 0 })
  onHand!: number;

  @Column({ name: 'low_at', type: 'int', unsigned: true, nullable: true })
  lowAt!: number | null;

  /** JSON of shared/schemas/shop.ts printerSettingsSchema. */
  @Column({ name: 'printer_settings', type: 'text' })
  printerSettings!: string;

  /** JSON of cutterSettingsSchema. */
  @Column({ name: 'cutter_settings', type: 'text' })
  cutterSettings!: string;

  @Column({ type: 'tinyint', unsigned: true, nullable: true })
  rating!: number | null;

  @Column({ name: 'food_safe', type: 'boolean', default: false })
  foodSafe!: boolean;

  @Column({ name: 'skin_safe', type: 'boolean', default: false })
  skinSafe!: boolean;

  @Column({ type: 'text', nullable: true })
  notes!: string | null;

  @Column({ name: 'archived_at', type: 'datetime', precision: 3, nullable: true })
  archivedAt!: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
