import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { RUN_RESULTS } from '@shared/schemas/shop';
import { day } from '../../db/columns';

/** One print run: what was printed and cut, on what, with which settings, and how it came out. */
@Entity({ name: 'print_runs' })
export class PrintRun {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ name: 'sheet_id', type: 'bigint', unsigned: true, nullable: true })
  sheetId!: string | null;

  @Column({ name: 'sheet_name', type: 'varchar', length: 120 })
  sheetName!: string;

  @Column({ name: 'sheet_version', type: 'int', unsigned: true })
  sheetVersion!: number;

  @Column({ type: 'int', unsigned: true })
  copies!: number;

  @Column({ type: 'int', unsigned: true, default: 0 })
  wasted!: number;

  @Column({ name: 'stock_id', type: 'bigint', unsigned: true, nullable: true })
  stockId!: string | null;

  @Column({ name: 'printer_id', type: 'bigint', unsigned: true, nullable: true })
  printerId!: string | null;

  @Column({ name: 'cutter_id', type: 'bigint', unsigned: true, nullable: true })
  cutterId!: string | null;

  @Column({ name: 'blade_id', type: 'bigint', unsigned: true, nullable: true })
  bladeId!: string | null;

  /** JSON: { printer, cutter } settings used on the run. */
  @Column({ name: 'settings_json', type: 'text' })
  settingsJson!: string;

  @Column({ type: 'enum', enum: ['good', 'misaligned', 'tore', 'other'] })
  result!: (typeof RUN_RESULTS)[number];

  @Column({ type: 'text', nullable: true })
  notes!: string | null;

  @Column({ name: 'photo_key', type: 'char', length: 64, nullable: true })
  photoKey!: string | null;

  /** The buyer's order the run was printed for, if any. */
  @Column({ name: 'order_id', type: 'bigint', unsigned: true, nullable: true })
  orderId!: string | null;

  @Column({ name: 'cut_length_mm', type: 'double' })
  cutLengthMm!: number;

  @Column({ name: 'printed_on', ...day() })
  printedOn!: string;

  @Column({ name: 'created_by', type: 'bigint', unsigned: true })
  createdBy!: string;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;
}
