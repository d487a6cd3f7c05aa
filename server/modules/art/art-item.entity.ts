import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

/** One piece of clip art in a team's library. The bytes live in storage under `storageKey`. */
@Entity({ name: 'art_items' })
@Index('uq_art_items_team_sha', ['teamId', 'sha256'], { unique: true })
export class ArtItem {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ type: 'varchar', length: 200 })
  name!: string;

  @Column({ type: 'char', length: 64 })
  sha256!: string;

  @Column({ name: 'storage_key', type: 'char', length: 64 })
  storageKey!: string;

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

  @Column({ name: 'uploaded_by', type: 'bigint', unsigned: true })
  uploadedBy!: string;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;

  @Column({ name: 'deleted_at', type: 'datetime', precision: 3, nullable: true })
  deletedAt!: Date | null;
}
