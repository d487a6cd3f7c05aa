import { Column, Entity, PrimaryColumn } from 'typeorm';

/** Art in a collection. Art may be in several; none of them sets its licence (see ArtItem.packId). */
@Entity({ name: 'art_collections' })
export class ArtCollection {
  @PrimaryColumn({ name: 'art_id', type: 'bigint', unsigned: true })
  artId!: string;

  @PrimaryColumn({ name: 'collection_id', type: 'bigint', unsigned: true })
  collectionId!: string;

  @Column({ name: 'added_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  addedAt!: Date;
}
