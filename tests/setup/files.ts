// Real file bytes for upload tests: a valid PDF and PNG, and executables dressed up as documents.
import { minimalPdf } from '../../apps/api/src/db/seed/minimal-pdf';

export const pdfBytes = (...lines: string[]) => minimalPdf(lines.length ? lines : ['Test certificate']);

/** A 1 x 1 pixel PNG. */
export const PNG_BYTES = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');

/** The start of a 64-bit ELF executable, padded: what a Linux binary renamed to .pdf looks like. */
export const ELF_BYTES = Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01, 0x00]), Buffer.alloc(120, 0)]);

/** The start of a Windows executable (MZ header with a PE offset), padded. */
export const MZ_BYTES = (() => {
  const b = Buffer.alloc(256, 0);
  b.write('MZ', 0, 'latin1');
  b.writeUInt32LE(0x80, 0x3c);
  b.write('PE\0\0', 0x80, 'latin1');
  return b;
})();

/** A date `days` from today (UTC), YYYY-MM-DD. */
export const isoDay = (days: number, from = new Date()) => new Date(from.getTime() + days * 86_400_000).toISOString().slice(0, 10);
