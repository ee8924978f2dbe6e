// JSON columns come back from mysql2 as text or already parsed, depending on the column type and
// driver options; every reader goes through this one helper.
export const json = <T>(v: unknown): T => (typeof v === 'string' ? (JSON.parse(v) as T) : (v as T));
