import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

@Entity({ name: 'teams' })
export class Team {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ type: 'varchar', length: 80 })
  name!: string;

  /** The team made at sign-up for one person's own library. */
  @Column({ type: 'boolean', default: false })
  personal!: boolean;

  /** Set only on rows the demo seeder made ("demo:shop"), so it never mistakes a user's team for its own. */
  @Column({ name: 'seed_key', type: 'varchar', length: 40, nullable: true, unique: true })
  seedKey!: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
