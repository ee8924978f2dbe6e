// Secrets handed out by e-mail or cookie; only their SHA-256 hashes are stored.
import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';
import type { MemberRole } from '@emberline/domain';

/** One link in a chain of rotating refresh tokens; a family is one sign-in. */
@Entity({ name: 'refresh_token' })
export class RefreshTokenEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  id!: string;

  @Column({ type: 'char', length: 36 })
  userId!: string;

  @Column({ type: 'char', length: 36 })
  familyId!: string;

  @Column({ type: 'char', length: 64, unique: true })
  tokenHash!: string;

  @Column({ type: 'datetime', precision: 3 })
  expiresAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  usedAt!: Date | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  revokedAt!: Date | null;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}

export type OneTimePurpose = 'verify_email' | 'reset_password';

/** Single-use, expiring token for e-mail verification and password reset. */
@Entity({ name: 'one_time_token' })
export class OneTimeTokenEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  id!: string;

  @Column({ type: 'char', length: 36 })
  userId!: string;

  @Column({ type: 'varchar', length: 24 })
  purpose!: OneTimePurpose;

  @Column({ type: 'char', length: 64, unique: true })
  tokenHash!: string;

  @Column({ type: 'datetime', precision: 3 })
  expiresAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  usedAt!: Date | null;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}

/** An invitation by e-mail to join an organisation with a role. */
@Entity({ name: 'invitation' })
export class InvitationEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  id!: string;

  @Column({ type: 'char', length: 36 })
  organisationId!: string;

  @Column({ type: 'varchar', length: 254 })
  email!: string;

  @Column({ type: 'varchar', length: 24 })
  role!: MemberRole;

  @Column({ type: 'char', length: 64, unique: true })
  tokenHash!: string;

  @Column({ type: 'char', length: 36 })
  invitedByUserId!: string;

  @Column({ type: 'datetime', precision: 3 })
  expiresAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  acceptedAt!: Date | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  revokedAt!: Date | null;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}
