import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryColumn } from 'typeorm';
import type { Role } from '@shared/permissions';
import { ROLES } from '@shared/permissions';
import { User } from './user.entity';
import { Team } from './team.entity';

@Entity({ name: 'memberships' })
export class Membership {
  @PrimaryColumn({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @PrimaryColumn({ name: 'user_id', type: 'bigint', unsigned: true })
  userId!: string;

  @ManyToOne(() => Team, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'team_id' })
  team?: Team;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user?: User;

  @Column({ type: 'enum', enum: ROLES })
  role!: Role;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;
}
