// A partner organisation: the tenant everything a partner owns is scoped by.
import { Column, CreateDateColumn, Entity, OneToMany, PrimaryColumn, UpdateDateColumn } from 'typeorm';
import type { OrganisationStatus } from '@emberline/domain';
import type { MembershipEntity } from './membership.entity';

@Entity({ name: 'organisation' })
export class OrganisationEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  id!: string;

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @Column({ type: 'varchar', length: 24, default: 'draft' })
  status!: OrganisationStatus;

  @Column({ type: 'varchar', length: 500, nullable: true })
  statusReason!: string | null;

  @OneToMany('MembershipEntity', (m: MembershipEntity) => m.organisation)
  memberships!: MembershipEntity[];

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
