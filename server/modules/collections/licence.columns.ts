import { Column } from 'typeorm';
import type { LicenceView } from '@shared/schemas/library';

const LICENCE_KINDS = ['personal', 'commercial', 'commercial_limited'] as const;
type LicenceKind = (typeof LICENCE_KINDS)[number];

/** Licence fields shared by collections (inherited by their art) and single art items. */
export class LicenceColumns {
  @Column({ name: 'licence_kind', type: 'enum', enum: LICENCE_KINDS, nullable: true })
  kind!: LicenceKind | null;

  @Column({ name: 'licence_source', type: 'varchar', length: 300, nullable: true })
  source!: string | null;

  @Column({ name: 'licence_notes', type: 'text', nullable: true })
  notes!: string | null;

  @Column({ name: 'licence_unit_limit', type: 'int', unsigned: true, nullable: true })
  unitLimit!: number | null;

  @Column({ name: 'licence_proof_key', type: 'char', length: 64, nullable: true })
  proofKey!: string | null;

  @Column({ name: 'licence_proof_name', type: 'varchar', length: 200, nullable: true })
  proofName!: string | null;
}

export function licenceView(licence: LicenceColumns, proofUrl: string | null): Omit<LicenceView, 'inheritedFrom'> | null {
  if (!licence.kind) return null;
  return {
    kind: licence.kind,
    source: licence.source ?? '',
    notes: licence.notes ?? '',
    unitLimit: licence.unitLimit ?? null,
    proofName: licence.proofName ?? null,
    proofUrl: licence.proofKey ? proofUrl : null,
  };
}
