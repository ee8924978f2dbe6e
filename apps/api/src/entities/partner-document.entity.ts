// A document a partner uploaded (insurance, registration, qualification, equipment evidence):
// the metadata here, the bytes in storage under a random key.
import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';
import type { DocumentKind } from '@emberline/domain';

@Entity({ name: 'partner_document' })
export class PartnerDocumentEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  id!: string;

  @Column({ type: 'char', length: 36 })
  organisationId!: string;

  @Column({ type: 'varchar', length: 16 })
  kind!: DocumentKind;

  /** The uploader's file name, sanitised; only ever shown, never used as a path. */
  @Column({ type: 'varchar', length: 160 })
  fileName!: string;

  @Column({ type: 'varchar', length: 64 })
  storageKey!: string;

  /** Sniffed from the content, never taken from the upload's headers. */
  @Column({ type: 'varchar', length: 64 })
  contentType!: string;

  @Column({ type: 'int', unsigned: true })
  sizeBytes!: number;

  @Column({ type: 'char', length: 64 })
  sha256!: string;

  /** YYYY-MM-DD */
  @Column({ type: 'date', nullable: true, utc: true })
  expiresOn!: string | null;

  @Column({ type: 'varchar', length: 64, nullable: true })
  capabilityCode!: string | null;

  @Column({ type: 'char', length: 36, nullable: true })
  uploadedBy!: string | null;

  @CreateDateColumn({ type: 'datetime', precision: 3 })
  createdAt!: Date;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  deletedAt!: Date | null;
}
