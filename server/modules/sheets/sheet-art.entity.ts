import { Entity, PrimaryColumn } from 'typeorm';

/** Which art a sheet uses (kept with every save), so art in use is found without reading documents. */
@Entity({ name: 'sheet_art' })
export class SheetArt {
  @PrimaryColumn({ name: 'sheet_id', type: 'bigint', unsigned: true })
  sheetId!: string;

  @PrimaryColumn({ name: 'art_id', type: 'bigint', unsigned: true })
  artId!: string;
}
