import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { day, decimal } from '../../db/columns';

/** A printer or a cutter of the team. */
@Entity({ name: 'machines' })
export class Machine {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ type: 'enum', enum: ['printer', 'cutter'] })
  kind!: 'printer' | 'cutter';

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @Column({ type: 'text', nullable: true })
  notes!: string | null;

  /** Printers: ink for one fully covered page. */
  @Column({ name: 'ink_full_page', ...decimal(10, 4, { nullable: true }) })
  inkFullPage!: number | null;

  @Column({ name: 'archived_at', type: 'datetime', precision: 3, nullable: true })
  archivedAt!: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;
}

/** A blade fitted in a cutter: the length it has cut, when it came out, and when to replace it. */
@Entity({ name: 'blades' })
export class Blade {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ name: 'cutter_id', type: 'bigint', unsigned: true })
  cutterId!: string;

  @Column({ type: 'varchar', length: 120 })
  label!: string;

  @Column({ name: 'fitted_on', ...day() })
  fittedOn!: string;

  @Column({ name: 'removed_on', ...day({ nullable: true }) })
  removedOn!: string | null;

  @Column({ name: 'cut_length_mm', type: 'double', default: 0 })
  cutLengthMm!: number;

  @Column({ name: 'life_m', ...decimal(10, 1) })
  lifeM!: number;

  @Column({ ...decimal(10, 2), default: 0 })
  price!: number;

  @Column({ name: 'fitted_by', type: 'bigint', unsigned: true })
  fittedBy!: string;

  @Column({ type: 'varchar', length: 300, nullable: true })
  note!: string | null;

  @Column({ name: 'replace_by', ...day({ nullable: true }) })
  replaceBy!: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;
}
