import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { LengthUnit } from '@shared/units';

@Entity({ name: 'users' })
export class User {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ type: 'varchar', length: 254, unique: true })
  email!: string;

  @Column({ type: 'varchar', length: 80 })
  name!: string;

  @Column({ name: 'password_hash', type: 'varchar', length: 60 })
  passwordHash!: string;

  @Column({ type: 'enum', enum: ['in', 'mm'], default: 'in' })
  unit!: LengthUnit;

  /** Set only on the demo seeder's accounts ("demo:owner"); they sign in only in demo mode. */
  @Column({ name: 'seed_key', type: 'varchar', length: 40, nullable: true, unique: true })
  seedKey!: string | null;

  /** Moves on at every password change, reset or "sign out everywhere"; older sessions end. */
  @Column({ name: 'session_epoch', type: 'int', unsigned: true, default: 0 })
  sessionEpoch!: number;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
