import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A team: its people, sessions, presets and renders. */
@Entity('studios')
export class Studio {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ type: 'varchar' })
  name!: string;

  @Column({ type: 'varchar', unique: true })
  slug!: string;

  @CreateDateColumn({ type: 'datetime' })
  createdAt!: Date;
}
