// Who did what, when, with the state before and after: written for every admin action.
import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

@Entity({ name: 'audit_log' })
export class AuditLogEntity {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id!: string;

  @Column({ type: 'char', length: 36, nullable: true })
  actorUserId!: string | null;

  @Column({ type: 'varchar', length: 64 })
  action!: string;

  @Column({ type: 'varchar', length: 48 })
  entityType!: string;

  @Column({ type: 'varchar', length: 64, nullable: true })
  entityId!: string | null;

  @Column({ type: 'char', length: 36, nullable: true })
  organisationId!: string | null;

  @Column({ type: 'json', nullable: true, name: 'before_state' })
  before!: object | null;

  @Column({ type: 'json', nullable: true, name: 'after_state' })
  after!: object | null;

  @Column({ type: 'varchar', length: 45, nullable: true })
  ip!: string | null;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;
}
