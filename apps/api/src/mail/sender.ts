// The network's sending address (MAIL_FROM) for what is written before a mail is sent, e.g. the
// ORGANIZER of a booking's calendar file, which the outbox then carries as it was written.
import type { DataSource, EntityManager } from 'typeorm';
import { DEFAULT_MAIL_FROM } from '../config';

const addresses = new WeakMap<DataSource, string>();

/** The bare address of `Name <address>` or of an address alone. */
export const addressOf = (from: string): string => (/<([^<>]+)>\s*$/.exec(from)?.[1] ?? from).trim();

/** Lets what is written through `dataSource` name `mailFrom` as the network's sender. */
export function useMailSender(dataSource: DataSource, mailFrom: string): void {
  addresses.set(dataSource, addressOf(mailFrom));
}

/** The sender's bare address; the default sender's where none was set (a job process that writes no calendars). */
export function senderAddressOf(source: DataSource | EntityManager): string {
  const dataSource = 'connection' in source ? source.connection : source;
  return addresses.get(dataSource) ?? addressOf(DEFAULT_MAIL_FROM);
}
