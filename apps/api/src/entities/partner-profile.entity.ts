// The application profile of a partner organisation: business details, service area, and the
// network's review of it (change request, checklist, internal notes).
import { Column, CreateDateColumn, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm';
import type { ReviewChecklist, WorkMode } from '@emberline/domain';

@Entity({ name: 'partner_profile' })
export class PartnerProfileEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  organisationId!: string;

  @Column({ type: 'varchar', length: 160, nullable: true })
  legalName!: string | null;

  @Column({ type: 'varchar', length: 120, nullable: true })
  tradingName!: string | null;

  @Column({ type: 'char', length: 2, nullable: true })
  country!: string | null;

  @Column({ type: 'varchar', length: 160, nullable: true })
  street!: string | null;

  @Column({ type: 'varchar', length: 16, nullable: true })
  postalCode!: string | null;

  @Column({ type: 'varchar', length: 100, nullable: true })
  city!: string | null;

  @Column({ type: 'varchar', length: 20, nullable: true })
  vatId!: string | null;

  @Column({ type: 'varchar', length: 32, nullable: true })
  phone!: string | null;

  @Column({ type: 'varchar', length: 120, nullable: true })
  baseLabel!: string | null;

  @Column({ type: 'double', nullable: true })
  baseLat!: number | null;

  @Column({ type: 'double', nullable: true })
  baseLng!: number | null;

  @Column({ type: 'varchar', length: 12, nullable: true })
  mode!: WorkMode | null;

  @Column({ type: 'smallint', unsigned: true, nullable: true })
  radiusKm!: number | null;

  @Column({ type: 'varchar', length: 240, nullable: true })
  workshopAddress!: string | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  submittedAt!: Date | null;

  @Column({ type: 'text', nullable: true })
  changeRequestMessage!: string | null;

  @Column({ type: 'json', nullable: true })
  changeRequestFields!: Record<string, string> | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  changeRequestedAt!: Date | null;

  @Column({ type: 'json', nullable: true })
  reviewChecklist!: ReviewChecklist | null;

  @Column({ type: 'text', nullable: true })
  internalNotes!: string | null;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @UpdateDateColumn({ type: 'datetime', precision: 3 })
  updatedAt!: Date;
}
