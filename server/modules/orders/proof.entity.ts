import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A proof sent to the buyer: what they were shown, frozen (lines, sizes, prices and the images'
 * storage keys), the link's token hash and expiry, and their answer.
 */
@Entity({ name: 'order_proofs' })
export class OrderProof {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'order_id', type: 'bigint', unsigned: true })
  orderId!: string;

  @Column({ name: 'token_hash', type: 'char', length: 64 })
  tokenHash!: string;

  @Column({ type: 'enum', enum: ['open', 'approved', 'changes', 'replaced'], default: 'open' })
  status!: 'open' | 'approved' | 'changes' | 'replaced';

  @Column({ name: 'sent_to', type: 'varchar', length: 254 })
  sentTo!: string;

  @Column({ name: 'expires_at', type: 'datetime', precision: 3 })
  expiresAt!: Date;

  /** JSON of ProofSnapshot (proofs.service.ts). */
  @Column({ name: 'snapshot_json', type: 'mediumtext' })
  snapshotJson!: string;

  @Column({ name: 'decided_at', type: 'datetime', precision: 3, nullable: true })
  decidedAt!: Date | null;

  @Column({ name: 'decided_name', type: 'varchar', length: 120, nullable: true })
  decidedName!: string | null;

  @Column({ name: 'decided_address', type: 'varchar', length: 64, nullable: true })
  decidedAddress!: string | null;

  @Column({ type: 'text', nullable: true })
  comment!: string | null;

  @Column({ name: 'created_by', type: 'bigint', unsigned: true })
  createdBy!: string;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;
}
