import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import { LicenceColumns } from '../collections/licence.columns';

/** One piece of clip art in a team's library. The bytes live in storage under `storageKey`. */
@Entity({ name: 'art_items' })
@Index('uq_art_items_team_sha', ['teamId', 'sha256'], { unique: true })
export class ArtItem {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  /**
   * The pack the art came in: the collection it was uploaded into. Its licence applies when the art
   * has none of its own, whichever collections the art is in later (art_collections).
   */
  @Column({ name: 'pack_id', type: 'bigint', unsigned: true, nullable: true })
  packId!: string | null;

  @Column({ type: 'varchar', length: 200 })
  name!: string;

  @Column({ type: 'char', length: 64 })
  sha256!: string;

  @Column({ name: 'storage_key', type: 'char', length: 64 })
  storageKey!: string;

  /** The cleaned vector source the art was drawn from (SVG), kept beside the PNG; null for raster uploads. */
  @Column({ name: 'source_key', type: 'char', length: 64, nullable: true })
  sourceKey!: string | null;

  @Column({ name: 'source_format', type: 'varchar', length: 10, nullable: true })
  sourceFormat!: 'svg' | null;

  @Column({ name: 'thumbnail_key', type: 'char', length: 64, nullable: true })
  thumbnailKey!: string | null;

  @Column({ type: 'varchar', length: 10 })
  format!: string;

  @Column({ name: 'size_bytes', type: 'int', unsigned: true })
  sizeBytes!: number;

  @Column({ name: 'width_px', type: 'int', unsigned: true })
  widthPx!: number;

  @Column({ name: 'height_px', type: 'int', unsigned: true })
  heightPx!: number;

  @Column({ name: 'has_transparency', type: 'boolean' })
  hasTransparency!: boolean;

  /** How the outline engine finds the art when the file has no transparency. */
  @Column({ name: 'background_mode', type: 'enum', enum: ['auto', 'keep', 'colour'], default: 'auto' })
  backgroundMode!: 'auto' | 'keep' | 'colour';

  @Column({ name: 'background_colour', type: 'char', length: 7, nullable: true })
  backgroundColour!: string | null;

  @Column({ name: 'background_tolerance', type: 'smallint', unsigned: true, default: 32 })
  backgroundTolerance!: number;

  /** The maker agreed that narrow parts of the cut line may be widened to the bridge width. */
  @Column({ name: 'widen_necks', type: 'boolean', default: false })
  widenNecks!: boolean;

  /** The item's own licence; empty fields fall back to its collection's. */
  @Column(() => LicenceColumns, { prefix: false })
  licence!: LicenceColumns;

  @Column({ name: 'uploaded_by', type: 'bigint', unsigned: true })
  uploadedBy!: string;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;

  @Column({ name: 'deleted_at', type: 'datetime', precision: 3, nullable: true })
  deletedAt!: Date | null;
}
