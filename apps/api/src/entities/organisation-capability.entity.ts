// A capability a partner organisation claims to hold, with its notes and serial number.
import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryColumn } from 'typeorm';
import { CapabilityEntity } from './capability.entity';

@Entity({ name: 'organisation_capability' })
export class OrganisationCapabilityEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  organisationId!: string;

  @PrimaryColumn({ type: 'int', unsigned: true })
  capabilityId!: number;

  @Column({ type: 'varchar', length: 500, nullable: true })
  notes!: string | null;

  @Column({ type: 'varchar', length: 80, nullable: true })
  serial!: string | null;

  @ManyToOne(() => CapabilityEntity)
  @JoinColumn({ name: 'capability_id' })
  capability!: CapabilityEntity;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}
