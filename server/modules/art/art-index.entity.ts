import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One keyword of an art item (normalised), as the maker typed it. */
@Entity({ name: 'art_keywords' })
export class ArtKeyword {
  @PrimaryColumn({ name: 'art_id', type: 'bigint', unsigned: true })
  artId!: string;

  @PrimaryColumn({ type: 'varchar', length: 60 })
  keyword!: string;
}

/** One search term of an art item: a normalised word of its name, keywords or collections (team, term indexed). */
@Entity({ name: 'art_terms' })
export class ArtTerm {
  @Column({ name: 'team_id', type: 'bigint', unsigned: true })
  teamId!: string;

  @PrimaryColumn({ name: 'art_id', type: 'bigint', unsigned: true })
  artId!: string;

  @PrimaryColumn({ type: 'varchar', length: 60 })
  term!: string;
}
