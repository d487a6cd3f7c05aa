import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { Role } from '@shared/permissions';
import { ROLES } from '@shared/permissions';
import { User } from '../accounts/user.entity';
import { Team } from '../accounts/team.entity';

/** A single-use invitation to a team. Only the SHA-256 of the e-mailed token is stored. */
@Entity({ name: 'invites' })
export class Invite {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @ManyToOne(() => Team, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'team_id' })
  team?: Team;

  @Column({ type: 'varchar', length: 254 })
  email!: string;

  @Column({ type: 'enum', enum: ROLES })
  role!: Role;

  @Index({ unique: true })
  @Column({ name: 'token_hash', type: 'char', length: 64 })
  tokenHash!: string;

  @Column({ name: 'invited_by', type: 'bigint', unsigned: true })
  invitedById!: string;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'invited_by' })
  invitedBy?: User;

  @Column({ name: 'expires_at', type: 'datetime', precision: 3 })
  expiresAt!: Date;

  @Column({ name: 'accepted_at', type: 'datetime', precision: 3, nullable: true })
  acceptedAt!: Date | null;

  @Column({ name: 'revoked_at', type: 'datetime', precision: 3, nullable: true })
  revokedAt!: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;
}
