import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import { LicenceColumns } from './licence.columns';

/** A team's shared collection of art, kept in order by owners and admins. */
@Entity({ name: 'collections' })
export class Collection {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @Column({ type: 'int', default: 0 })
  position!: number;

  /** Members may add art to it (owners and admins always may). */
  @Column({ name: 'members_can_add', type: 'boolean', default: true })
  membersCanAdd!: boolean;

  @Column({ name: 'archived_at', type: 'datetime', precision: 3, nullable: true })
  archivedAt!: Date | null;

  @Column(() => LicenceColumns, { prefix: false })
  licence!: LicenceColumns;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
