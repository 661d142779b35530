import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A server-side setting (e.g. the token signing secret); never shipped in the repository. */
@Entity('setting')
export class Setting {
  @PrimaryColumn('varchar', { length: 64 })
  key!: string;

  @Column('text')
  value!: string;
}
