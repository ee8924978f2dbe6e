// `npm run bench -- booking`: 50 owners book 10 free starts of one technician at the same moment
// (5 per start), against the real app in-process over HTTP, in a database of its own on the
// bench MariaDB, paying through an in-process payments fake. Exactly 10 bookings must result,
// the other 40 answered 409 SLOT_TAKEN, and no two bookings of the technician may overlap.
// Reports the time the 50 requests took; writes var/bench/booking.json.
import type { AddressInfo } from 'node:net';
import { mkdirSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createApp } from '../../apps/api/src/app';
import { loadConfig } from '../../apps/api/src/config';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { migrateAndSeed } from '../../apps/api/src/db/migrate';
import { createPaymentsFake } from '../../apps/api/src/fakes/payments/payments-fake';
import { newId } from '../../apps/api/src/lib/secure-token';
import { createLogger } from '../../apps/api/src/lib/logger';
import { signAccessToken } from '../../apps/api/src/services/session.service';
import { ensureDatabase, startMariaDb } from './mariadb';
import { ok, step } from './output';
import { benchDatabase, dbEnv, root, varDir } from './project';

const ATTEMPTS = 50;
const SLOTS = 10;
const JWT_SECRET = 'bench-secret-bench-secret-bench-secret-0123';
const SECRET_KEY = 'sk_test_emberline_bench';
const WEBHOOK_SECRET = 'whsec_emberline_bench';
/** Innsbruck: the partner's base and, a little west, the owners' place. */
const BASE = { lat: 47.2692, lng: 11.4041 };
const PLACE = { lat: 47.26, lng: 11.39 };

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
const round = (v: number) => Math.round(v * 10) / 10;

export async function benchBooking(): Promise<void> {
  // the search bench's server, in a database of the booking bench's own
  const settings = { ...benchDatabase(), name: 'emberline_bench_booking' };
  step(`Bench MariaDB on 127.0.0.1:${settings.port} (data in ${path.relative(root, settings.dir)}/), database ${settings.name}, recreated`);
  const db = await startMariaDb(settings.dir, settings.port);
  const fake = await createPaymentsFake({ port: 0, secretKey: SECRET_KEY, webhookSecret: WEBHOOK_SECRET });
  let server: ReturnType<ReturnType<typeof createApp>['listen']> | undefined;
  let dataSource: ReturnType<typeof createDataSource> | undefined;
  try {
    ensureDatabase(db, { ...settings, recreate: true });
    const env = {
      ...dbEnv(settings),
      NODE_ENV: 'development',
      LOG_LEVEL: 'warn',
      DB_POOL_SIZE: '10',
      SERVE_APPS: 'false',
      RUN_SCHEDULER: 'false',
      PUBLIC_URL: 'http://127.0.0.1',
      STRIPE_API_BASE: fake.url,
      STRIPE_SECRET_KEY: SECRET_KEY,
      STRIPE_WEBHOOK_SECRET: WEBHOOK_SECRET,
    };
    const config = loadConfig(env);
    await migrateAndSeed({ ...config, DB_POOL_SIZE: 2 }, { demo: false });
    dataSource = await createDataSource(config).initialize();
    const ds = dataSource;

    // one approved mobile partner with one technician, working every day 08:00–18:00 (Vienna)
    const q = (sql: string, params: unknown[] = []) => ds.query(sql, params);
    const orgId = newId();
    const technicianId = newId();
    await q("INSERT INTO organisation (id, name, status) VALUES (?, 'Bench booking partner', 'approved')", [orgId]);
    await q(
      "INSERT INTO partner_profile (organisation_id, legal_name, trading_name, country, base_label, base_lat, base_lng, mode, radius_km) VALUES (?, 'Bench booking partner e.U.', 'Bench booking partner', 'AT', 'Innsbruck', ?, ?, 'mobile', 50)",
      [orgId, BASE.lat, BASE.lng],
    );
    await q("INSERT INTO organisation_capability (organisation_id, capability_id) SELECT ?, id FROM capability WHERE code = 'digital-multimeter'", [orgId]);
    await q("INSERT INTO user_account (id, email, name, password_hash, email_verified_at) VALUES (?, 'technician@bench.example', 'Bench technician', '-', NOW(3))", [technicianId]);
    await q("INSERT INTO membership (organisation_id, user_id, role) VALUES (?, ?, 'technician')", [orgId, technicianId]);
    const offerId = newId();
    await q(
      `INSERT INTO offer (id, organisation_id, service_type_id, price_minor, currency, duration_minutes, deposit, cancellation)
       SELECT ?, ?, id, 4500, 'EUR', 30, '{"kind":"none"}', '{"freeUntilHours":24,"feeMinor":0}' FROM service_type WHERE code = 'handset-pairing'`,
      [offerId, orgId],
    );
    await q('INSERT INTO offer_technician (offer_id, organisation_id, user_id) VALUES (?, ?, ?)', [offerId, orgId, technicianId]);
    await q("INSERT INTO travel_policy (organisation_id, free_within_km, rate_per_km_minor, currency, max_distance_km) VALUES (?, 20, 80, 'EUR', 150)", [orgId]);
    const day = [{ start: '08:00', end: '18:00' }];
    const hours = { timeZone: 'Europe/Vienna', weekly: { monday: day, tuesday: day, wednesday: day, thursday: day, friday: day, saturday: day, sunday: day }, exceptions: [], minimumNoticeMinutes: 60, bookingHorizonDays: 30, bufferMinutes: 0 };
    await q('INSERT INTO working_hours (organisation_id, user_id, hours) VALUES (?, ?, ?)', [orgId, technicianId, JSON.stringify(hours)]);
    const owners: string[] = [];
    for (let i = 0; i < ATTEMPTS; i++) {
      const id = newId();
      await q("INSERT INTO user_account (id, email, name, password_hash, is_owner, email_verified_at) VALUES (?, ?, ?, '-', 1, NOW(3))", [id, `owner-${i}@bench.example`, `Bench owner ${i}`]);
      owners.push(signAccessToken(id, { jwtSecret: JWT_SECRET, accessTtlSeconds: 3600, refreshTtlDays: 1 }));
    }

    const app = createApp({ config, dataSource: ds, logger: createLogger(config.LOG_LEVEL), version: 'bench', jwtSecret: JWT_SECRET });
    server = app.listen(0, '127.0.0.1');
    await new Promise<void>((resolve) => server!.once('listening', () => resolve()));
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

    // ten starts an hour apart (no two jobs of 30 minutes can touch), from tomorrow on
    const from = new Date(Date.now() + 86_400_000).toISOString();
    const slots = (await (await fetch(`${base}/api/partners/${orgId}/slots?${new URLSearchParams({ serviceType: 'handset-pairing', lat: String(PLACE.lat), lng: String(PLACE.lng), days: '3', from })}`)).json()) as {
      data: { organisation: { start: string }[] };
    };
    const starts: string[] = [];
    for (const s of slots.data.organisation) if (!starts.length || Date.parse(s.start) - Date.parse(starts.at(-1)!) >= 3_600_000) starts.push(s.start);
    if (starts.length < SLOTS) throw new Error(`Only ${starts.length} starts an hour apart; the bench needs ${SLOTS}`);
    starts.length = SLOTS;

    step(`${ATTEMPTS} owners book ${SLOTS} starts of one technician at once (${ATTEMPTS / SLOTS} per start), over HTTP`);
    const body = (start: string) => ({
      partnerId: orgId,
      serviceType: 'handset-pairing',
      start,
      jobAt: 'owner',
      address: { line: 'Museumstraße 5', postalCode: '6020', city: 'Innsbruck', country: 'AT', ...PLACE },
      vehicle: { model: 'Bench van', fuel: 'diesel', factoryHeater: 'coolant_auxiliary', climateControl: 'automatic', electricalSystemV: 12 },
      customer: { kind: 'consumer' },
    });
    const t0 = performance.now();
    const answers = await Promise.all(
      owners.map(async (token, i) => {
        const started = performance.now();
        const res = await fetch(`${base}/api/bookings`, { method: 'POST', headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` }, body: JSON.stringify(body(starts[i % SLOTS]!)) });
        const json = (await res.json()) as { code?: string };
        return { status: res.status, code: json.code ?? null, ms: performance.now() - started };
      }),
    );
    const totalMs = performance.now() - t0;

    const booked = answers.filter((a) => a.status === 201).length;
    const taken = answers.filter((a) => a.status === 409 && a.code === 'SLOT_TAKEN').length;
    const other = answers.filter((a) => a.status !== 201 && !(a.status === 409 && a.code === 'SLOT_TAKEN'));
    const rows: { start_at: Date; end_at: Date }[] = await q('SELECT start_at, end_at FROM booking WHERE organisation_id = ? ORDER BY start_at', [orgId]);
    const overlaps = rows.filter((r, i) => i > 0 && new Date(r.start_at) < new Date(rows[i - 1]!.end_at)).length;
    const latencies = answers.map((a) => a.ms).sort((a, b) => a - b);
    const machine = `${os.cpus().length} × ${os.cpus()[0]?.model ?? 'cpu'}, ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.versions.node}, ${os.loadavg()[0]!.toFixed(1)} load`;
    const report = {
      attempts: ATTEMPTS,
      slots: SLOTS,
      booked,
      slotTaken: taken,
      otherAnswers: other.map((a) => `${a.status} ${a.code ?? ''}`.trim()),
      bookingRows: rows.length,
      overlaps,
      totalMs: round(totalMs),
      latencyP50Ms: round(percentile(latencies, 50)),
      latencyP95Ms: round(percentile(latencies, 95)),
      latencyMaxMs: round(latencies.at(-1)!),
      dbPoolSize: config.DB_POOL_SIZE,
      machine,
      at: new Date().toISOString(),
    };
    console.log(`
  ${report.booked} booked, ${report.slotTaken} refused with 409 SLOT_TAKEN, ${other.length} other answers; ${report.bookingRows} booking rows, ${report.overlaps} overlapping
  all ${ATTEMPTS} requests in ${report.totalMs} ms; each p50 ${report.latencyP50Ms} ms, p95 ${report.latencyP95Ms} ms, max ${report.latencyMaxMs} ms
  on ${machine}`);
    mkdirSync(path.join(varDir, 'bench'), { recursive: true });
    writeFileSync(path.join(varDir, 'bench', 'booking.json'), JSON.stringify(report, null, 2) + '\n');
    if (booked !== SLOTS || rows.length !== SLOTS || taken !== ATTEMPTS - SLOTS || overlaps) {
      console.error(`  expected exactly ${SLOTS} bookings and ${ATTEMPTS - SLOTS} refusals`);
      process.exitCode = 1;
    } else ok(`Exactly ${SLOTS} bookings for ${SLOTS} starts`);
  } finally {
    if (server) await new Promise<void>((resolve) => server!.close(() => resolve()));
    if (dataSource?.isInitialized) await dataSource.destroy();
    await fake.close();
    if (db.startedHere) await db.stop();
  }
}
