// Links a user to an organisation with a role there.
import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryColumn } from 'typeorm';
import type { MemberRole } from '@emberline/domain';
import { OrganisationEntity } from './organisation.entity';
import { UserAccountEntity } from './user-account.entity';

@Entity({ name: 'membership' })
export class MembershipEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  organisationId!: string;

  @PrimaryColumn({ type: 'char', length: 36 })
  userId!: string;

  @Column({ type: 'varchar', length: 24 })
  role!: MemberRole;

  @ManyToOne(() => OrganisationEntity, (o) => o.memberships, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'organisation_id' })
  organisation!: OrganisationEntity;

  @ManyToOne(() => UserAccountEntity, (u) => u.memberships, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id' })
  user!: UserAccountEntity;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}
