// The search's in-memory index of approved partners (services/search-index.ts) learns what changed
// from a change log the database writes itself: a trigger on every table the index reads adds a
// row with the organisation concerned, whatever writes it (the API, the seed, an admin's SQL).
// Rows only ever get added by single-row inserts, so no transaction waits for another's log row
// (a shared counter row would make every writer wait for the others and could deadlock them).
import type { MigrationInterface, QueryRunner } from 'typeorm';

const TABLE_OPTIONS = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

type Row = 'NEW' | 'OLD';

/**
 * The tables the index reads, how a row names its organisation, and for updates which columns
 * matter (null: any). A part matters only through its price (stock moves with every completed
 * job); an organisation through its status and name.
 */
const WATCHED: { table: string; organisation: (row: Row) => string; updateWhen: ((o: Row, n: Row) => string) | null }[] = [
  { table: 'organisation', organisation: (r) => `${r}.id`, updateWhen: () => 'NOT (OLD.status <=> NEW.status AND OLD.name <=> NEW.name)' },
  { table: 'partner_profile', organisation: (r) => `${r}.organisation_id`, updateWhen: null },
  { table: 'organisation_capability', organisation: (r) => `${r}.organisation_id`, updateWhen: null },
  { table: 'membership', organisation: (r) => `${r}.organisation_id`, updateWhen: null },
  { table: 'offer', organisation: (r) => `${r}.organisation_id`, updateWhen: null },
  { table: 'offer_technician', organisation: (r) => `${r}.organisation_id`, updateWhen: null },
  { table: 'offer_part', organisation: (r) => `(SELECT f.organisation_id FROM offer f WHERE f.id = ${r}.offer_id)`, updateWhen: null },
  { table: 'part', organisation: (r) => `${r}.organisation_id`, updateWhen: () => 'NOT (OLD.unit_price_minor <=> NEW.unit_price_minor)' },
  { table: 'travel_policy', organisation: (r) => `${r}.organisation_id`, updateWhen: null },
  { table: 'working_hours', organisation: (r) => `${r}.organisation_id`, updateWhen: null },
];

const EVENTS = [
  { event: 'INSERT', suffix: 'ins', row: 'NEW' as Row },
  { event: 'UPDATE', suffix: 'upd', row: 'NEW' as Row },
  { event: 'DELETE', suffix: 'del', row: 'OLD' as Row },
];

export const searchIndexTriggers = WATCHED.flatMap((w) => EVENTS.map((e) => ({ ...w, ...e, name: `search_index_${w.table}_${e.suffix}` })));

/**
 * Rows removed by a foreign key's ON DELETE CASCADE fire no trigger. Deleting an organisation, an
 * offer or a part is logged by its own trigger; deleting a user takes their memberships with it,
 * so that is logged, for each of their organisations, before the user goes.
 */
const USER_DELETE_TRIGGER = 'search_index_user_account_del';

export class SearchIndex1764690000000 implements MigrationInterface {
  name = 'SearchIndex1764690000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE search_index_change (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
      organisation_id CHAR(36) NOT NULL,
      changed_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (id),
      KEY ix_search_index_change_time (changed_at)
    ) ${TABLE_OPTIONS}`);
    for (const t of searchIndexTriggers) {
      const when = t.event === 'UPDATE' && t.updateWhen ? ` AND ${t.updateWhen('OLD', 'NEW')}` : '';
      await q.query(`CREATE TRIGGER ${t.name} AFTER ${t.event} ON ${t.table} FOR EACH ROW
        BEGIN
          DECLARE changed_organisation CHAR(36) DEFAULT NULL;
          SET changed_organisation = ${t.organisation(t.row)};
          IF changed_organisation IS NOT NULL${when} THEN
            INSERT INTO search_index_change (organisation_id) VALUES (changed_organisation);
          END IF;
        END`);
    }
    await q.query(`CREATE TRIGGER ${USER_DELETE_TRIGGER} BEFORE DELETE ON user_account FOR EACH ROW
      INSERT INTO search_index_change (organisation_id) SELECT m.organisation_id FROM membership m WHERE m.user_id = OLD.id`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const name of [...searchIndexTriggers.map((t) => t.name), USER_DELETE_TRIGGER]) await q.query(`DROP TRIGGER IF EXISTS ${name}`);
    await q.query('DROP TABLE search_index_change');
  }
}
