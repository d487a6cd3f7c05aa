import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

const decimal = { type: 'decimal' as const, precision: 8, scale: 3, transformer: { to: (v: number) => v, from: (v: string) => Number(v) } };

/** Paper, the cutter's print area on it, safe margin and minimum gap: one set a team prints with. */
@Entity({ name: 'sheet_profiles' })
export class SheetProfile {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ type: 'varchar', length: 80 })
  name!: string;

  @Column({ type: 'enum', enum: ['letter', 'a4', 'custom'] })
  paper!: 'letter' | 'a4' | 'custom';

  @Column({ name: 'paper_width_mm', ...decimal })
  paperWidthMm!: number;

  @Column({ name: 'paper_height_mm', ...decimal })
  paperHeightMm!: number;

  @Column({ name: 'area_width_mm', ...decimal })
  areaWidthMm!: number;

  @Column({ name: 'area_height_mm', ...decimal })
  areaHeightMm!: number;

  @Column({ name: 'area_x_mm', ...decimal })
  areaXMm!: number;

  @Column({ name: 'area_y_mm', ...decimal })
  areaYMm!: number;

  @Column({ name: 'safe_margin_mm', ...decimal, precision: 6 })
  safeMarginMm!: number;

  @Column({ name: 'min_gap_mm', ...decimal, precision: 6 })
  minGapMm!: number;

  @Column({ name: 'smallest_sticker_mm', ...decimal, precision: 6 })
  smallestStickerMm!: number;

  @Column({ name: 'min_feature_mm', ...decimal, precision: 6 })
  minFeatureMm!: number;

  /** Width of the cut shape where the border joins separate parts of the art (never below the smallest feature). */
  @Column({ name: 'bridge_width_mm', ...decimal, precision: 6 })
  bridgeWidthMm!: number;

  /** Name of the spot colour the cutter's software looks for on the PDF's cut layer. */
  @Column({ name: 'spot_colour', type: 'varchar', length: 40, default: 'CutContour' })
  spotColour!: string;

  /** Registration marks printed around the print area, for cutters that read them ('none': the cutter's software adds its own). */
  @Column({ name: 'reg_mark_shape', type: 'enum', enum: ['none', 'square', 'dot', 'bracket'], default: 'none' })
  regMarkShape!: 'none' | 'square' | 'dot' | 'bracket';

  @Column({ name: 'reg_mark_size_mm', ...decimal, precision: 6 })
  regMarkSizeMm!: number;

  /** Gap between the print area's corner and the nearest edge of its mark. */
  @Column({ name: 'reg_mark_offset_mm', ...decimal, precision: 6 })
  regMarkOffsetMm!: number;

  @Column({ name: 'is_default', type: 'boolean', default: false })
  isDefault!: boolean;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
