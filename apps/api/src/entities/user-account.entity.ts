// A person who signs in: van owner, technician, partner admin or network admin.
import { Column, CreateDateColumn, Entity, OneToMany, PrimaryColumn, UpdateDateColumn } from 'typeorm';
import type { MembershipEntity } from './membership.entity';

@Entity({ name: 'user_account' })
export class UserAccountEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  id!: string;

  @Column({ type: 'varchar', length: 254, unique: true })
  email!: string;

  @Column({ type: 'varchar', length: 120 })
  name!: string;

  @Column({ type: 'varchar', length: 100 })
  passwordHash!: string;

  @Column({ type: 'varchar', length: 5, default: 'en' })
  locale!: 'en' | 'de';

  @Column({ type: 'boolean', default: false })
  isOwner!: boolean;

  @Column({ type: 'boolean', default: false })
  isNetworkAdmin!: boolean;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  emailVerifiedAt!: Date | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  lockedUntil!: Date | null;

  /** Access tokens carry it; raising it (password reset) ends every token issued before. */
  @Column({ type: 'int', unsigned: true, default: 0 })
  tokenVersion!: number;

  @OneToMany('MembershipEntity', (m: MembershipEntity) => m.user)
  memberships!: MembershipEntity[];

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
