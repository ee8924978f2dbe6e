// Scheduled job: deletes coverage gaps and alerts past their retention, and the search index's
// change log past its own.
import { purgeCoverage } from '../services/coverage.service';
import { pruneSearchIndexChanges } from '../services/search-index';
import type { JobContext } from './scheduler';

export async function coverageRetention({ dataSource, logger }: JobContext): Promise<void> {
  const deleted = await purgeCoverage(dataSource.manager, new Date());
  if (deleted.gaps || deleted.alerts) logger.info(deleted, 'old coverage gaps and alerts deleted');
  const changes = await pruneSearchIndexChanges(dataSource.manager, new Date());
  if (changes) logger.info({ changes }, 'old search index change-log rows deleted');
}
