// express-rate-limit's Store over MariaDB: fixed-window counters that every API instance shares.
import { createHash } from 'node:crypto';
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import type { Logger } from '../lib/logger';

// One statement per hit: the row is created, counted or started afresh when its window has lapsed,
// and RETURNING hands back the count and the window's end. The database's clock decides, so
// instances whose clocks differ still agree on every window. MariaDB evaluates the assignments
// left to right; the second still reads the old window_ends_at because the first does not set it.
const INCREMENT = `INSERT INTO rate_limit_counter (key_hash, hits, window_ends_at)
  VALUES (?, 1, UTC_TIMESTAMP(3) + INTERVAL ? MICROSECOND)
  ON DUPLICATE KEY UPDATE
    hits = IF(window_ends_at <= UTC_TIMESTAMP(3), 1, hits + 1),
    window_ends_at = IF(window_ends_at <= UTC_TIMESTAMP(3), VALUES(window_ends_at), window_ends_at)
  RETURNING hits, window_ends_at`;

type CounterRow = { hits: number | string; window_ends_at: Date };

const info = (row: CounterRow): ClientRateLimitInfo => ({ totalHits: Number(row.hits), resetTime: new Date(row.window_ends_at) });

/** The table and the sweep of lapsed rows, one per app, shared by all of its stores. */
export class RateLimitTable {
  private nextSweepAt = 0;

  constructor(
    readonly dataSource: DataSource,
    private readonly logger: Logger,
    private readonly sweepEveryMs = 5 * 60_000,
  ) {}

  /**
   * A lapsed row does no harm (the next hit starts it afresh); the sweep only keeps the table
   * small. Any instance may run it, so no job has to be elected for it; it rides on a hit without
   * delaying it, and a row lapsed for less than a minute is left alone to stay clear of live ones.
   */
  sweepIfDue(): void {
    const now = Date.now();
    if (now < this.nextSweepAt) return;
    this.nextSweepAt = now + this.sweepEveryMs;
    this.dataSource
      .query('DELETE FROM rate_limit_counter WHERE window_ends_at < UTC_TIMESTAMP(3) - INTERVAL 1 MINUTE LIMIT 10000')
      .catch((err: unknown) => this.logger.warn({ err }, 'Sweeping lapsed rate-limit counters failed'));
  }
}

/** One per limiter (express-rate-limit refuses a store shared by two); `prefix` keeps their keys apart. */
export class MariaDbStore implements Store {
  readonly localKeys = false;
  private windowMs = 60_000;

  constructor(
    private readonly table: RateLimitTable,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private keyHash(key: string): Buffer {
    return createHash('sha256').update(this.prefix + key, 'utf8').digest();
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    this.table.sweepIfDue();
    const params = [this.keyHash(key), this.windowMs * 1000];
    try {
      return info((await this.table.dataSource.query(INCREMENT, params))[0]);
    } catch (err) {
      // two first hits on one key can deadlock on the insert; the retry finds the row
      if ((err as { code?: string }).code !== 'ER_LOCK_DEADLOCK') throw err;
      return info((await this.table.dataSource.query(INCREMENT, params))[0]);
    }
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const rows: CounterRow[] = await this.table.dataSource.query(
      'SELECT hits, window_ends_at FROM rate_limit_counter WHERE key_hash = ? AND window_ends_at > UTC_TIMESTAMP(3)',
      [this.keyHash(key)],
    );
    return rows[0] ? info(rows[0]) : undefined;
  }

  async decrement(key: string): Promise<void> {
    await this.table.dataSource.query('UPDATE rate_limit_counter SET hits = hits - 1 WHERE key_hash = ? AND hits > 0 AND window_ends_at > UTC_TIMESTAMP(3)', [this.keyHash(key)]);
  }

  async resetKey(key: string): Promise<void> {
    await this.table.dataSource.query('DELETE FROM rate_limit_counter WHERE key_hash = ?', [this.keyHash(key)]);
  }
}
