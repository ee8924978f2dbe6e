// The search index's bookkeeping of the change log, without a database: a fake manager answers the
// index's SQL from in-memory rows, where a log row of a transaction not committed yet stays hidden
// (its id is handed out at insert, so later ids can be visible first), and a fake clock stands in
// for the database's clock (NOW(3) and the rows' changed_at), which times the holes. What is
// checked is what the index asks, its stats and the snapshot.
import type { EntityManager } from 'typeorm';
import { describe, expect, it } from 'vitest';
import { CHANGE_HOLE_TIMEOUT_MS, MAX_CHANGES_APPLIED, SearchIndex } from '../../../apps/api/src/services/search-index';

type Kind = 'check' | 'settled' | 'above' | 'changes' | 'partners' | 'offers' | 'capabilities' | 'technicians';

/** Every statement the index may send, by its text (whitespace folded); anything else fails the test. */
const STATEMENTS: [Kind, RegExp][] = [
  ['check', /^SELECT COUNT\(\*\) AS n, MAX\(id\) AS top, NOW\(3\) AS at FROM search_index_change WHERE id > \?$/],
  ['settled', /^SELECT MAX\(id\) AS floor FROM search_index_change WHERE changed_at < NOW\(3\) - INTERVAL \? SECOND$/],
  ['above', /^SELECT id, changed_at, NOW\(3\) AS at FROM search_index_change WHERE id > \?$/],
  ['changes', /^SELECT id, organisation_id, changed_at, NOW\(3\) AS at FROM search_index_change WHERE id > \? ORDER BY id$/],
  ['partners', /FROM organisation o JOIN partner_profile p /],
  ['offers', /FROM offer f JOIN organisation o /],
  ['capabilities', /FROM organisation_capability oc /],
  ['technicians', /FROM offer_technician ot /],
];
const LOADING: Kind[] = ['partners', 'offers', 'capabilities', 'technicians'];
const FULL_LOAD: Kind[] = ['settled', 'above', ...LOADING];
const SERVICE_TYPE_ID = 7;
const T0 = Date.parse('2026-03-02T09:00:00Z');

interface LogRow {
  id: number;
  organisation_id: string;
  changed_at: number;
  committed: boolean;
}

/** The database as the index sees it: the change log, and the approved partners by id (name, labour price). */
class FakeDb {
  readonly log: LogRow[] = [];
  readonly partners = new Map<string, { name: string; priceMinor: number }>();
  sent: { kind: Kind; sql: string; params: unknown[] }[] = [];
  private failing = new Set<Kind>();
  private held = new Map<Kind, Promise<void>>();

  constructor(private readonly now: () => number) {}

  readonly manager = { query: (sql: string, params: unknown[] = []) => this.query(sql, params) } as unknown as EntityManager;

  /** A log row written now; `committed: false` keeps it hidden, as a transaction still running. */
  write(id: number, organisationId: string, o: { committed?: boolean; at?: number } = {}): void {
    this.log.push({ id, organisation_id: organisationId, changed_at: o.at ?? this.now(), committed: o.committed ?? true });
  }

  commit(id: number): void {
    this.log.find((r) => r.id === id)!.committed = true;
  }

  /** The next statement of this kind fails, as with a lost connection. */
  failNext(kind: Kind): void {
    this.failing.add(kind);
  }

  /** Statements of this kind are answered (from the data as it is when they arrive) only once `release` is called. */
  hold(kind: Kind): () => void {
    let release!: () => void;
    this.held.set(kind, new Promise<void>((resolve) => (release = resolve)));
    return () => {
      this.held.delete(kind);
      release();
    };
  }

  /** The statements sent since the last call. */
  take(): { kind: Kind; sql: string; params: unknown[] }[] {
    const sent = this.sent;
    this.sent = [];
    return sent;
  }

  private query(sql: string, params: unknown[]): Promise<unknown> {
    const text = sql.replace(/\s+/g, ' ').trim();
    const kind = STATEMENTS.find(([, pattern]) => pattern.test(text))?.[0];
    if (!kind) return Promise.reject(new Error(`unexpected statement: ${text}`));
    this.sent.push({ kind, sql: text, params });
    if (this.failing.delete(kind)) return Promise.reject(new Error('Connection lost: The server closed the connection.'));
    const rows = this.answer(kind, params);
    return (this.held.get(kind) ?? Promise.resolve()).then(() => rows);
  }

  private answer(kind: Kind, params: unknown[]): unknown[] {
    const visible = this.log.filter((r) => r.committed).sort((a, b) => a.id - b.id);
    const above = () => visible.filter((r) => r.id > (params[0] as number));
    // NOW(3): the fake clock stands for the database's
    const now = new Date(this.now());
    // MariaDB returns COUNT(*) and the BIGINT ids as strings or numbers depending on the driver's settings
    const max = (rows: LogRow[]) => (rows.length ? String(rows[rows.length - 1]!.id) : null);
    const organisations = () => [...this.partners.keys()].filter((id) => !params.length || (params[0] as string[]).includes(id));
    switch (kind) {
      case 'check':
        return [{ n: String(above().length), top: max(above()), at: now }];
      case 'settled':
        return [{ floor: max(visible.filter((r) => r.changed_at < now.getTime() - (params[0] as number) * 1000)) }];
      case 'above':
        return above().map((r) => ({ id: String(r.id), changed_at: new Date(r.changed_at), at: now }));
      case 'changes':
        return above().map((r) => ({ id: String(r.id), organisation_id: r.organisation_id, changed_at: new Date(r.changed_at), at: now }));
      case 'partners':
        return organisations().map((id) => ({
          id,
          name: this.partners.get(id)!.name,
          city: 'Oulu',
          base_lat: 65.01,
          base_lng: 25.47,
          mode: 'mobile',
          radius_km: 60,
          free_within_km: null,
          rate_per_km_minor: null,
          policy_currency: null,
          max_distance_km: null,
        }));
      case 'offers':
        return organisations().map((id) => ({
          id: `offer-of-${id}`,
          organisation_id: id,
          service_type_id: SERVICE_TYPE_ID,
          price_minor: String(this.partners.get(id)!.priceMinor),
          currency: 'EUR',
          duration_minutes: 30,
          parts_minor: '0',
        }));
      default:
        return [];
    }
  }
}

function setup() {
  const clock = { now: T0 };
  const db = new FakeDb(() => clock.now);
  const index = new SearchIndex();
  db.partners.set('org-a', { name: 'Fernlicht Heizdienst', priceMinor: 4500 });
  db.partners.set('org-b', { name: 'Kaltstart Mobil', priceMinor: 3900 });
  // rows 1-9, written an hour ago: settled
  for (let id = 1; id <= 9; id++) db.write(id, id % 2 ? 'org-a' : 'org-b', { at: T0 - 3_600_000 });
  return { clock, db, index, current: () => index.current(db.manager) };
}

const kinds = (sent: { kind: Kind }[]) => sent.map((s) => s.kind);
/** The organisations a partial reload asked for: the same `IN (?)` list in each of the four loading statements. */
function reloaded(sent: { kind: Kind; sql: string; params: unknown[] }[]): string[] {
  const loading = sent.filter((s) => LOADING.includes(s.kind));
  expect(loading.map((s) => s.kind).sort()).toEqual([...LOADING].sort());
  for (const s of loading) {
    expect(s.sql).toContain(' IN (?)');
    expect(s.params).toEqual(loading[0]!.params);
  }
  return [...(loading[0]!.params[0] as string[])].sort();
}

describe('SearchIndex: following the change log', () => {
  it('loads everything on the first call, then sends only the one check while nothing changes', async () => {
    const { db, current, index } = setup();
    const first = await current();
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 0 });
    const sent = db.take();
    expect(kinds(sent)).toEqual([...FULL_LOAD, 'check']);
    // the full load reads every approved partner: no list of organisations
    for (const s of sent.filter((x) => LOADING.includes(x.kind))) {
      expect(s.params).toEqual([]);
      expect(s.sql).not.toContain(' IN (?)');
    }
    expect([...first.partners.keys()].sort()).toEqual(['org-a', 'org-b']);
    expect(first.partners.get('org-a')!.offers.get(SERVICE_TYPE_ID)).toMatchObject({ offerId: 'offer-of-org-a', labourMinor: 4500 });
    const bands = [...first.byService.get(SERVICE_TYPE_ID)!.values()].flatMap((b) => b.partners);
    expect(bands.map((p) => p.partnerId).sort()).toEqual(['org-a', 'org-b']);

    for (let i = 0; i < 3; i++) {
      expect(await current()).toBe(first);
      // asked from the highest settled row on
      expect(db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [9] }]);
    }
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 0 });
  });

  it('reloads only the organisation a new log row names, and drops one that is no longer approved', async () => {
    const { db, current, index } = setup();
    const first = await current();
    db.take();

    db.partners.set('org-b', { name: 'Kaltstart Mobil Nord', priceMinor: 4100 });
    db.write(10, 'org-b');
    const second = await current();
    const sent = db.take();
    expect(kinds(sent)).toEqual(['check', 'changes', ...LOADING]);
    expect(reloaded(sent)).toEqual(['org-b']);
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 1 });
    expect(second).not.toBe(first);
    expect(second.partners.get('org-b')).toMatchObject({ name: 'Kaltstart Mobil Nord' });
    expect(second.partners.get('org-b')!.offers.get(SERVICE_TYPE_ID)!.labourMinor).toBe(4100);
    // the other partner is the very object loaded before; the first snapshot is left as it was
    expect(second.partners.get('org-a')).toBe(first.partners.get('org-a'));
    expect(first.partners.get('org-b')!.name).toBe('Kaltstart Mobil');

    // suspended: the reload finds nothing, so the partner leaves the index and its bands
    db.partners.delete('org-a');
    db.write(11, 'org-a');
    db.write(12, 'org-a');
    const third = await current();
    expect(reloaded(db.take())).toEqual(['org-a']);
    expect([...third.partners.keys()]).toEqual(['org-b']);
    expect([...third.byService.get(SERVICE_TYPE_ID)!.values()].flatMap((b) => b.partners).map((p) => p.partnerId)).toEqual(['org-b']);
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 2 });

    expect(await current()).toBe(third);
    expect(db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [12] }]);
  });

  it('applies a log row that becomes visible after higher ones (a transaction that committed late)', async () => {
    const { db, current, index, clock } = setup();
    await current();
    db.take();

    // row 10 belongs to a transaction still running (approving org-c); 11 and 12 commit first
    db.write(10, 'org-c', { committed: false });
    db.write(11, 'org-a');
    db.write(12, 'org-b');
    await current();
    expect(reloaded(db.take())).toEqual(['org-a', 'org-b']);

    // the hole alone is no reason to reload; the check still starts below it
    clock.now += 30_000;
    await current();
    expect(db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [9] }]);

    clock.now += 30_000;
    db.partners.set('org-c', { name: 'Glutnest Standheizung', priceMinor: 5200 });
    db.commit(10);
    const snapshot = await current();
    const sent = db.take();
    expect(kinds(sent)).toEqual(['check', 'changes', ...LOADING]);
    expect(reloaded(sent)).toEqual(['org-c']);
    expect(snapshot.partners.get('org-c')).toMatchObject({ name: 'Glutnest Standheizung' });
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 3 });

    // everything up to 12 applied: the floor moved over the filled hole
    expect(await current()).toBe(snapshot);
    expect(db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [12] }]);
  });

  it('gives up a hole that never fills after CHANGE_HOLE_TIMEOUT_MS, without reloading meanwhile or after', async () => {
    const { db, current, index, clock } = setup();
    await current();
    // id 10 went to a transaction that was rolled back: it never appears
    db.write(11, 'org-a');
    db.write(12, 'org-b');
    const applied = await current();
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 2 });
    db.take();

    clock.now += CHANGE_HOLE_TIMEOUT_MS - 1;
    expect(await current()).toBe(applied);
    expect(db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [9] }]);

    // this call's check finds nothing new and gives the hole up: the next one starts above 12
    clock.now += 1;
    expect(await current()).toBe(applied);
    expect(db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [9] }]);
    for (let i = 0; i < 3; i++) {
      clock.now += CHANGE_HOLE_TIMEOUT_MS;
      expect(await current()).toBe(applied);
      expect(db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [12] }]);
    }
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 2 });

    // and a change after it is applied as usual
    db.write(13, 'org-a');
    await current();
    expect(reloaded(db.take())).toEqual(['org-a']);
  });

  it(`reloads the organisations one by one up to MAX_CHANGES_APPLIED (${MAX_CHANGES_APPLIED}) at once, and loads everything beyond`, async () => {
    const at = (n: number) => {
      const s = setup();
      return { ...s, changeMany: () => Array.from({ length: n }, (_, i) => s.db.write(10 + i, `org-many-${i}`)) };
    };

    const within = at(MAX_CHANGES_APPLIED);
    await within.current();
    within.changeMany();
    within.db.take();
    await within.current();
    const sent = within.db.take();
    expect(kinds(sent)).toEqual(['check', 'changes', ...LOADING]);
    expect(reloaded(sent)).toHaveLength(MAX_CHANGES_APPLIED);
    expect(within.index.stats).toEqual({ fullLoads: 1, organisationsReloaded: MAX_CHANGES_APPLIED });

    const beyond = at(MAX_CHANGES_APPLIED + 1);
    await beyond.current();
    beyond.changeMany();
    beyond.db.take();
    beyond.db.partners.set('org-b', { name: 'Kaltstart Mobil Süd', priceMinor: 3900 });
    const snapshot = await beyond.current();
    const full = beyond.db.take();
    expect(kinds(full)).toEqual(['check', 'changes', ...FULL_LOAD]);
    for (const s of full.filter((x) => LOADING.includes(x.kind))) expect(s.params).toEqual([]);
    expect(beyond.index.stats).toEqual({ fullLoads: 2, organisationsReloaded: 0 });
    expect(snapshot.partners.get('org-b')!.name).toBe('Kaltstart Mobil Süd');
    // the rows the full load covered are not applied again
    expect(await beyond.current()).toBe(snapshot);
    expect(beyond.db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [10 + MAX_CHANGES_APPLIED] }]);
  });

  it('lets calls made while a load runs wait for it instead of loading again', async () => {
    const { db, current, index } = setup();
    const [one, two] = await Promise.all([current(), current()]);
    expect(two).toBe(one);
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 0 });
    expect(kinds(db.take()).filter((k) => k === 'settled' || k === 'partners')).toEqual(['settled', 'partners']);

    // a change; the reload's partner query is slow, and a second search comes meanwhile
    db.write(10, 'org-b');
    const release = db.hold('partners');
    const first = current();
    await new Promise((resolve) => setImmediate(resolve));
    expect(kinds(db.sent)).toContain('partners');
    const second = current();
    await new Promise((resolve) => setImmediate(resolve));
    release();
    const [a, b] = await Promise.all([first, second]);
    expect(b).toBe(a);
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 1 });
    expect(kinds(db.take()).filter((k) => k !== 'check')).toEqual(['changes', ...LOADING]);
  });

  it('does not keep a failed load: the call fails, and the next one tries again', async () => {
    const { db, current, index } = setup();
    db.failNext('partners');
    // the call that started the load and one waiting for it both fail
    const results = await Promise.allSettled([current(), current()]);
    expect(results.map((r) => r.status)).toEqual(['rejected', 'rejected']);
    expect(index.stats).toEqual({ fullLoads: 0, organisationsReloaded: 0 });
    db.take();
    const loaded = await current();
    expect(kinds(db.take())).toEqual([...FULL_LOAD, 'check']);
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 0 });

    // a failed partial reload leaves its rows unapplied
    db.partners.set('org-a', { name: 'Fernlicht Heizdienst Nord', priceMinor: 4500 });
    db.write(10, 'org-a');
    db.failNext('offers');
    await expect(current()).rejects.toThrow('Connection lost');
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 0 });
    db.take();
    const retried = await current();
    expect(reloaded(db.take())).toEqual(['org-a']);
    expect(retried.partners.get('org-a')!.name).toBe('Fernlicht Heizdienst Nord');
    expect(loaded.partners.get('org-a')!.name).toBe('Fernlicht Heizdienst');
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 1 });
  });

  it('keeps the floor where it is when a hole given up by one search is filled during another search\'s reload', async () => {
    const { db, current, index, clock } = setup();
    await current();
    db.write(10, 'org-c', { committed: false });
    db.write(11, 'org-a');
    db.write(12, 'org-b');
    await current();
    clock.now += CHANGE_HOLE_TIMEOUT_MS;
    // search X takes the index and its check; row 10 then commits and search Y starts reloading it
    const x = await index.check(db.manager);
    db.partners.set('org-c', { name: 'Glutnest Standheizung', priceMinor: 5200 });
    db.commit(10);
    const release = db.hold('partners');
    const y = current();
    await new Promise((resolve) => setImmediate(resolve));
    // X's statement had been answered before row 10 was visible: nothing new, and the hole is old enough to give up
    expect(x.isCurrent({ n: '2', top: '12', at: new Date(clock.now) })).toBe(true);
    release();
    expect((await y).partners.get('org-c')).toMatchObject({ name: 'Glutnest Standheizung' });
    db.take();
    // row 10 lies below the floor now: not kept as applied-but-pending, so no reload on every call
    for (let i = 0; i < 2; i++) {
      await current();
      expect(db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [12] }]);
    }
  });

  it('on a first load with no settled row, waits for an id below the visible ones (a transaction still open)', async () => {
    const clock = { now: T0 };
    const db = new FakeDb(() => clock.now);
    const index = new SearchIndex();
    db.partners.set('org-a', { name: 'Fernlicht Heizdienst', priceMinor: 4500 });
    // a log emptied by the retention job; ids go on from where they were
    db.write(500, 'org-c', { committed: false });
    db.write(501, 'org-a');
    await index.current(db.manager);
    expect(index.stats.fullLoads).toBe(1);
    db.take();
    clock.now += 60_000;
    db.partners.set('org-c', { name: 'Glutnest Standheizung', priceMinor: 5200 });
    db.commit(500);
    const snapshot = await index.current(db.manager);
    expect(reloaded(db.take())).toEqual(['org-c']);
    expect(snapshot.partners.get('org-c')).toMatchObject({ name: 'Glutnest Standheizung' });
    // ids 1–499 are holes until the rows after them are old enough
    await index.current(db.manager);
    clock.now += CHANGE_HOLE_TIMEOUT_MS;
    await index.current(db.manager);
    await index.current(db.manager);
    expect(db.take().map((q) => q.params)).toEqual([[0], [0], [501]]);
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 1 });
  });

  it('moves the floor over a long run of missing ids at once, when the row after them is old enough', async () => {
    const clock = { now: T0 };
    const db = new FakeDb(() => clock.now);
    const index = new SearchIndex();
    db.write(3_000_000, 'org-a');
    await index.current(db.manager);
    db.take();
    await index.current(db.manager);
    expect(db.take()).toEqual([{ kind: 'check', sql: expect.any(String), params: [0] }]);
    clock.now += CHANGE_HOLE_TIMEOUT_MS;
    await index.current(db.manager);
    await index.current(db.manager);
    expect(db.take().map((q) => q.params)).toEqual([[0], [3_000_000]]);
    expect(index.stats).toEqual({ fullLoads: 1, organisationsReloaded: 0 });
  });

  it('hands out the loaded index with its check without asking anything, and the check sees a change', async () => {
    const { db, current, index } = setup();
    const loaded = await current();
    db.take();
    const check = await index.check(db.manager);
    expect(db.take()).toEqual([]);
    expect(check.snapshot).toBe(loaded);
    expect(check.sql).toMatch(STATEMENTS[0]![1]);
    expect(check.params).toEqual([9]);
    const at = new Date(T0);
    expect(check.isCurrent({ n: '0', top: null, at })).toBe(true);
    // one row the index has not applied
    expect(check.isCurrent({ n: '1', top: '10', at })).toBe(false);

    // after a reload by another search, an old check is no longer current
    db.write(10, 'org-b');
    await current();
    expect(check.isCurrent({ n: '0', top: null, at })).toBe(false);
  });
});
