import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import { decimal } from '../../db/columns';

/** A sheet: its metadata and its document (JSON, see shared/sheet/document.ts), versioned for saves. */
@Entity({ name: 'sheets' })
export class Sheet {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ name: 'owner_id', type: 'bigint', unsigned: true })
  ownerId!: string;

  @Column({ name: 'profile_id', type: 'bigint', unsigned: true, nullable: true })
  profileId!: string | null;

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @Column({ type: 'enum', enum: ['in', 'mm'], default: 'in' })
  unit!: 'in' | 'mm';

  @Column({ type: 'enum', enum: ['draft', 'ready', 'printed'], default: 'draft' })
  status!: 'draft' | 'ready' | 'printed';

  @Column({ name: 'for_sale', type: 'boolean', default: false })
  forSale!: boolean;

  @Column({ type: 'text', nullable: true })
  notes!: string | null;

  @Column({ type: 'int', unsigned: true, default: 1 })
  version!: number;

  @Column({ type: 'mediumtext' })
  document!: string;

  @Column({ name: 'is_template', type: 'boolean', default: false })
  isTemplate!: boolean;

  @Column({ name: 'piece_count', type: 'int', unsigned: true, default: 0 })
  pieceCount!: number;

  @Column({
    name: 'area_used',
    type: 'decimal',
    precision: 6,
    scale: 5,
    default: 0,
    transformer: { to: (v: number) => v, from: (v: string) => Number(v) },
  })
  areaUsed!: number;

  @Column({ name: 'thumbnail_key', type: 'char', length: 64, nullable: true })
  thumbnailKey!: string | null;

  /** What the sheet is costed on (the print room's choices; not part of the document, no new version). */
  @Column({ name: 'stock_id', type: 'bigint', unsigned: true, nullable: true })
  stockId!: string | null;

  @Column({ name: 'printer_id', type: 'bigint', unsigned: true, nullable: true })
  printerId!: string | null;

  @Column({ name: 'cutter_id', type: 'bigint', unsigned: true, nullable: true })
  cutterId!: string | null;

  @Column({ name: 'labour_minutes', ...decimal(6, 1), default: 0 })
  labourMinutes!: number;

  /** The buyer's order the sheet was made for, if any. */
  @Column({ name: 'order_id', type: 'bigint', unsigned: true, nullable: true })
  orderId!: string | null;

  /** The last analysis (shared/schemas/shop.ts SheetAnalysis as JSON) and the version it was made for. */
  @Column({ name: 'analysis_json', type: 'mediumtext', nullable: true, select: false })
  analysisJson!: string | null;

  @Column({ name: 'analysis_version', type: 'int', unsigned: true, nullable: true })
  analysisVersion!: number | null;

  @Column({ name: 'updated_by', type: 'bigint', unsigned: true, nullable: true })
  updatedBy!: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
