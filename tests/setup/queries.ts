// Counts the SQL statements an app sends, for tests that hold a route to a fixed number of them.
import type { DataSource } from 'typeorm';

/** The statements `ds` sends while `fn` runs, through every query runner it creates. */
export async function countQueries(ds: DataSource, fn: () => Promise<unknown>): Promise<number> {
  const original = ds.createQueryRunner.bind(ds);
  let n = 0;
  ds.createQueryRunner = ((mode?: 'master' | 'slave') => {
    const runner = original(mode);
    const query = runner.query.bind(runner);
    runner.query = ((...args: Parameters<typeof query>) => {
      n++;
      return query(...args);
    }) as typeof runner.query;
    return runner;
  }) as typeof ds.createQueryRunner;
  try {
    await fn();
  } finally {
    ds.createQueryRunner = original;
  }
  return n;
}
