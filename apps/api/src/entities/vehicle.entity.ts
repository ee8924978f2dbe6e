// A vehicle in an owner's garage.
import { Column, CreateDateColumn, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm';
import type { FactoryHeater } from '@emberline/domain';

@Entity({ name: 'vehicle' })
export class VehicleEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  id!: string;

  @Column({ type: 'char', length: 36 })
  ownerUserId!: string;

  @Column({ type: 'varchar', length: 80 })
  name!: string;

  @Column({ type: 'varchar', length: 120 })
  model!: string;

  @Column({ type: 'smallint', unsigned: true })
  year!: number;

  @Column({ type: 'varchar', length: 12 })
  fuel!: 'diesel' | 'petrol';

  @Column({ type: 'varchar', length: 24 })
  factoryHeater!: FactoryHeater;

  @Column({ type: 'varchar', length: 12 })
  climateControl!: 'automatic' | 'manual';

  @Column({ type: 'tinyint', unsigned: true, name: 'electrical_system_v' })
  electricalSystemV!: 12 | 24;

  @Column({ type: 'smallint', unsigned: true })
  batteryCapacityAh!: number;

  @Column({ type: 'varchar', length: 12 })
  batteryType!: 'flooded' | 'agm';

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
