// A piece of equipment or a skill a partner can hold, with a stable code.
import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { CapabilityCategory } from '@emberline/domain';

@Entity({ name: 'capability' })
export class CapabilityEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 64, unique: true })
  code!: string;

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @Column({ type: 'text' })
  description!: string;

  @Column({ type: 'varchar', length: 32 })
  category!: CapabilityCategory;

  @Column({ type: 'json' })
  standards!: string[];

  @Column({ type: 'boolean', default: false })
  retired!: boolean;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
