import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { ExportJobView } from '@shared/schemas/exports';
import { decimal } from '../../db/columns';

/** One export of a sheet version: its job's progress, the options and frozen document it ran on, and the bundle. */
@Entity({ name: 'sheet_exports' })
export class SheetExport {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @Column({ name: 'sheet_id', type: 'bigint', unsigned: true })
  sheetId!: string;

  @Column({ name: 'sheet_version', type: 'int', unsigned: true })
  sheetVersion!: number;

  @Column({ type: 'enum', enum: ['running', 'done', 'failed'] })
  status!: ExportJobView['status'];

  @Column({ ...decimal(4, 3), default: 0 })
  progress!: number;

  @Column({ type: 'varchar', length: 120, default: '' })
  step!: string;

  @Column({ type: 'varchar', length: 500, nullable: true })
  error!: string | null;

  @Column({ name: 'options_json', type: 'text' })
  optionsJson!: string;

  /** The document as it was when the export was asked for (the job works from it, not a later save). */
  @Column({ name: 'document_json', type: 'mediumtext', nullable: true })
  documentJson!: string | null;

  @Column({ name: 'findings_json', type: 'mediumtext', nullable: true })
  findingsJson!: string | null;

  @Column({ name: 'zip_key', type: 'char', length: 64, nullable: true })
  zipKey!: string | null;

  @Column({ name: 'zip_name', type: 'varchar', length: 120, nullable: true })
  zipName!: string | null;

  @Column({ name: 'files_json', type: 'text', nullable: true })
  filesJson!: string | null;

  @Column({ type: 'smallint', unsigned: true, default: 0 })
  attempts!: number;

  /** The queue the job went to (null: rows from before the queue). */
  @Column({ name: 'queue_prefix', type: 'varchar', length: 100, nullable: true })
  queuePrefix!: string | null;

  @Column({ name: 'created_by', type: 'bigint', unsigned: true })
  createdBy!: string;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
