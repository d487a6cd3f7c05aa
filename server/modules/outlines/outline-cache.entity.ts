import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A computed outline, keyed by SHA-256 of (engine version, art content hash, canonical options).
 * The PNGs are in storage; `result` holds everything else as JSON.
 */
@Entity({ name: 'outline_cache' })
export class OutlineCacheEntry {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'cache_key', type: 'char', length: 64, unique: true })
  cacheKey!: string;

  @Column({ name: 'art_sha256', type: 'char', length: 64 })
  artSha256!: string;

  @Column({ name: 'options_json', type: 'text' })
  optionsJson!: string;

  @Column({ name: 'result_json', type: 'mediumtext' })
  resultJson!: string;

  @Column({ name: 'compute_ms', type: 'int', unsigned: true })
  computeMs!: number;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @Column({ name: 'last_used_at', type: 'datetime', precision: 3 })
  lastUsedAt!: Date;
}
