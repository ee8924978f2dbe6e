// An entry of the platform catalogue: what owners can book and which capabilities it requires.
import { Column, CreateDateColumn, Entity, JoinTable, ManyToMany, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { CautionCode } from '@emberline/domain';
import { CapabilityEntity } from './capability.entity';

@Entity({ name: 'service_type' })
export class ServiceTypeEntity {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'varchar', length: 64, unique: true })
  code!: string;

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @Column({ type: 'varchar', length: 300 })
  summary!: string;

  @Column({ type: 'text' })
  description!: string;

  @Column({ type: 'smallint', unsigned: true })
  defaultDurationMinutes!: number;

  @Column({ type: 'json' })
  cautions!: CautionCode[];

  @Column({ type: 'smallint', default: 0 })
  sortOrder!: number;

  @Column({ type: 'boolean', default: false })
  retired!: boolean;

  @ManyToMany(() => CapabilityEntity)
  @JoinTable({
    name: 'service_type_capability',
    joinColumn: { name: 'service_type_id', referencedColumnName: 'id' },
    inverseJoinColumn: { name: 'capability_id', referencedColumnName: 'id' },
  })
  requiredCapabilities!: CapabilityEntity[];

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
