// An insurance expiry reminder that was sent: one per document and threshold (30, 7, 1, 0 days).
import { Column, Entity, PrimaryColumn } from 'typeorm';

@Entity({ name: 'insurance_reminder' })
export class InsuranceReminderEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  documentId!: string;

  @PrimaryColumn({ type: 'tinyint', unsigned: true })
  daysBefore!: number;

  @Column({ type: 'char', length: 36 })
  organisationId!: string;

  @Column({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  sentAt!: Date;
}
