// One e-mail waiting to be sent, sent, or given up on; rendered when queued, link tokens redacted.
import { Column, Entity, PrimaryColumn } from 'typeorm';

export type MailStatus = 'pending' | 'sent' | 'failed';

/** A file sent with the message, e.g. a calendar invitation; `content` is base64. */
export interface MailAttachment {
  filename: string;
  contentType: string;
  content: string;
}

/** A template's data as stored: texts, numbers, and money or instants as small objects. */
export type MailTemplateValues = { [field: string]: string | number | { [part: string]: string | number } };

@Entity({ name: 'mail_outbox' })
export class MailOutboxEntity {
  @PrimaryColumn({ type: 'char', length: 36 })
  id!: string;

  @Column({ type: 'varchar', length: 254, name: 'to_address' })
  to!: string;

  @Column({ type: 'varchar', length: 48 })
  template!: string;

  @Column({ type: 'varchar', length: 5 })
  locale!: string;

  @Column({ type: 'varchar', length: 300 })
  subject!: string;

  @Column({ type: 'mediumtext', name: 'text_body' })
  text!: string;

  @Column({ type: 'mediumtext', name: 'html_body' })
  html!: string;

  @Column({ type: 'json', nullable: true })
  attachments!: MailAttachment[] | null;

  /** The template's data with every link token redacted: what the log may show. Null on rows queued before it existed. */
  @Column({ type: 'json', nullable: true, name: 'template_data' })
  templateData!: MailTemplateValues | null;

  /** The redacted fields' real values, sealed (AES-256-GCM); set to null once sent or given up on. */
  @Column({ type: 'text', nullable: true, name: 'secret_data' })
  secretData!: string | null;

  @Column({ type: 'varchar', length: 12, default: 'pending' })
  status!: MailStatus;

  @Column({ type: 'smallint', unsigned: true, default: 0 })
  attempts!: number;

  @Column({ type: 'datetime', precision: 3 })
  nextAttemptAt!: Date;

  @Column({ type: 'varchar', length: 500, nullable: true })
  lastError!: string | null;

  @Column({ type: 'varchar', length: 300, nullable: true })
  messageId!: string | null;

  @Column({ type: 'datetime', precision: 3, nullable: true })
  sentAt!: Date | null;

  @Column({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt!: Date;
}
