// Fuzzes every operation of the OpenAPI document with seeded fast-check requests: near-valid and
// hostile path parameters, query strings and bodies, as anonymous and signed-in callers. Every
// answer must be a 2xx/3xx or a 4xx problem-details body: never a 5xx, never a stack trace.
// Reproduce a run with FUZZ_SEED=<seed>; FUZZ_REQUESTS sets how many it sends; FUZZ_DEBUG=1 adds latencies.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_LIMITS, type LimitSettings } from '../../apps/api/src/middleware/rate-limits';
import { createTestApp, type TestApp } from '../setup/app';
import { partnerWithTeam, signUpAndVerify, type SignedIn } from '../setup/accounts';
import { networkAdmin } from '../setup/onboarding';
import { pdfBytes, PNG_BYTES } from '../setup/files';
import { startPaymentsFake, type TestPaymentsFake } from '../setup/payments';

const SEED = Number(process.env.FUZZ_SEED ?? 1_312_026);
const REQUESTS = Number(process.env.FUZZ_REQUESTS ?? 10_000);
const CONCURRENCY = 6;
/** Requests drawn per fast-check sample: each batch has its own seed (SEED + batch number). */
const BATCH = 500;

type JsonSchema = {
  $ref?: string;
  type?: string | string[];
  enum?: unknown[];
  const?: unknown;
  format?: string;
  pattern?: string;
  minLength?: number;
  maxLength?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number | boolean;
  exclusiveMaximum?: number | boolean;
  minItems?: number;
  maxItems?: number;
  items?: JsonSchema;
  properties?: Record<string, JsonSchema>;
  required?: string[];
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  nullable?: boolean;
  default?: unknown;
};

interface Operation {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  pathParams: { name: string; schema: JsonSchema }[];
  query: { name: string; schema: JsonSchema; required: boolean }[];
  json?: JsonSchema;
  multipart?: JsonSchema;
  needsAuth: boolean;
}

type CallerName = 'anonymous' | 'owner' | 'partnerAdmin' | 'technician' | 'networkAdmin';

interface FuzzRequest {
  op: Operation;
  caller: CallerName;
  authorization?: string;
  url: string;
  contentType?: string;
  body?: Buffer;
  /** What kind of body was sent, for the counts. */
  bodyKind: string;
}

let t: TestApp;
let payments: TestPaymentsFake;
let server: http.Server;
let agent: http.Agent;
let base: { host: string; port: number };
let doc: { paths: Record<string, Record<string, OpenApiOperation>>; components?: { schemas?: Record<string, JsonSchema> } };
const operations: Operation[] = [];
const callers: Partial<Record<CallerName, SignedIn>> = {};
/** Real values for path parameters by name, so requests reach the handlers, not only the 404s. */
const realValues: Record<string, string[]> = {};

interface OpenApiOperation {
  parameters?: { name: string; in: string; required?: boolean; schema: JsonSchema }[];
  requestBody?: { content: Record<string, { schema: JsonSchema }> };
  security?: Record<string, string[]>[];
}

const resolve = (s: JsonSchema | undefined): JsonSchema => {
  let schema = s ?? {};
  for (let i = 0; schema.$ref && i < 10; i++) schema = doc.components?.schemas?.[schema.$ref.split('/').pop()!] ?? {};
  return schema;
};

// ---------- hostile values ----------

/** Text of any UTF-16 code units, lone surrogates included. */
const anyUtf16 = fc.string({ unit: fc.integer({ min: 0, max: 0xffff }).map((c) => String.fromCharCode(c)), maxLength: 24 });
const deepArray = (depth: number) => '['.repeat(depth) + ']'.repeat(depth);
const hostileText = fc.oneof(
  fc.constantFrom('', ' ', '\t', '0', '-0', '0x10', '0b1', '1e999', 'NaN', 'Infinity', 'null', 'true', '2031-02-31', '2026-13-01', '2026-02-29', '0000-00-00', '24:60', '2026-03-29T25:00:00+02:00'),
  fc.constantFrom('\ud800', 'a\udc00b', '\udbff\ud800', 'emoji \u{1F525} ok', '\u0000', '\u202e', '<script>alert(1)</script>', "' OR 1=1 --", '../../etc/passwd', '%E0%A4%A', '${jndi:x}'),
  anyUtf16,
  fc.constant('x'.repeat(70_000)),
);
const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 6, arbitrary: hostileText },
  { weight: 1, arbitrary: fc.constantFrom(null, true, false, 0, -1, 1.5, 2 ** 53, -(2 ** 63), 1e308, -1e308, Number.MIN_VALUE) },
  { weight: 1, arbitrary: fc.constantFrom([], {}, [null], { __proto__: { admin: true } }, JSON.parse('{"__proto__":{"isNetworkAdmin":true}}'), { constructor: { prototype: { x: 1 } } }) },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
  { weight: 1, arbitrary: fc.integer({ min: 50, max: 3000 }).map((d) => JSON.parse(deepArray(d)) as unknown) },
);

/** Raw path segments: sent as they are, so malformed percent-encoding reaches the server. */
const hostileSegment = fc.constantFrom('%E0%A4%A', '%', '%zz', '%ED%A0%80', '%C0%AF', '%00', '..', '.', '%2F', 'a%2Fb', '%2e%2e', '%20', 'null', 'undefined', '0', '-1', '00000000-0000-0000-0000-000000000000', 'x'.repeat(2000), encodeURIComponent('\u{1F525}'));
/** Raw query values. */
const hostileQueryValue = fc.oneof(
  hostileSegment,
  hostileText.map((v) => encodeURIComponent(v.replace(/[\ud800-\udfff]/g, '?'))),
  fc.constantFrom('', '%20%20', '+', '0x10', '1e5', '2031-02-31', '%ED%A0%80', '%FF', '&', '='),
);

// ---------- values from the schemas ----------

const isoDate = fc.oneof(
  fc.date({ min: new Date('2000-01-01'), max: new Date('2040-12-31'), noInvalidDate: true }).map((d) => d.toISOString().slice(0, 10)),
  fc.tuple(fc.integer({ min: 1990, max: 2040 }), fc.integer({ min: 0, max: 13 }), fc.integer({ min: 0, max: 32 })).map(([y, m, d]) => `${y}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`),
);
const isoDateTime = fc.oneof(
  fc.date({ min: new Date('2020-01-01'), max: new Date('2035-12-31'), noInvalidDate: true }).map((d) => d.toISOString()),
  fc.tuple(isoDate, fc.integer({ min: 0, max: 25 }), fc.constantFrom('Z', '+02:00', '-14:00', '+99:00')).map(([d, h, z]) => `${d}T${String(h).padStart(2, '0')}:00:00${z}`),
);

function fromSchema(input: JsonSchema | undefined, depth = 0): fc.Arbitrary<unknown> {
  const s = resolve(input);
  if (depth > 6) return fc.constant(null);
  if (s.const !== undefined) return fc.constant(s.const);
  if (s.enum) return fc.constantFrom(...s.enum);
  const alternatives = s.anyOf ?? s.oneOf;
  if (alternatives?.length) return fc.oneof(...alternatives.map((a) => fromSchema(a, depth + 1)));
  if (s.allOf?.length) return fromSchema(Object.assign({}, ...s.allOf.map(resolve)), depth + 1);
  const types = Array.isArray(s.type) ? s.type : s.type ? [s.type] : [];
  if (types.length > 1) return fc.oneof(...types.map((type) => fromSchema({ ...s, type }, depth + 1)));
  switch (types[0]) {
    case 'null':
      return fc.constant(null);
    case 'boolean':
      return fc.boolean();
    case 'integer':
    case 'number': {
      const min = typeof s.exclusiveMinimum === 'number' ? s.exclusiveMinimum + 1 : (s.minimum ?? -1000);
      const max = typeof s.exclusiveMaximum === 'number' ? s.exclusiveMaximum - 1 : (s.maximum ?? 100_000);
      const lo = Math.max(min, -1e9);
      const hi = Math.max(lo, Math.min(max, 1e9));
      return types[0] === 'integer' ? fc.integer({ min: Math.ceil(lo), max: Math.floor(hi) }) : fc.double({ min: lo, max: hi, noNaN: true, noDefaultInfinity: true });
    }
    case 'string': {
      if (s.format === 'uuid') return fc.uuid();
      if (s.format === 'email') return fc.emailAddress();
      if (s.format === 'date') return isoDate;
      if (s.format === 'date-time') return isoDateTime;
      if (s.pattern) {
        try {
          return fc.stringMatching(new RegExp(s.pattern)).filter((v) => v.length <= (s.maxLength ?? 200));
        } catch {
          // a pattern fast-check cannot invert: plain strings will do
        }
      }
      return fc.string({ minLength: s.minLength ?? 0, maxLength: Math.min(s.maxLength ?? 40, 40) });
    }
    case 'array':
      return fc.array(fromSchema(s.items, depth + 1), { minLength: s.minItems ?? 0, maxLength: Math.min(s.maxItems ?? 3, 3) });
    case 'object':
    default: {
      if (!s.properties) return types[0] === 'object' ? fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 1 }), { maxKeys: 3 }) : fc.jsonValue({ maxDepth: 2 });
      const required = new Set(s.required ?? []);
      const entries = Object.entries(s.properties).map(([k, v]) => [k, fromSchema(v, depth + 1)] as const);
      return fc.record(Object.fromEntries(entries), { requiredKeys: Object.keys(s.properties).filter((k) => required.has(k)) });
    }
  }
}

/** Every node of a JSON value, as paths, so one can be swapped for a hostile value. */
function nodePaths(value: unknown, path: (string | number)[] = [], out: (string | number)[][] = [], depth = 0): (string | number)[][] {
  out.push(path);
  if (depth < 8 && value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) nodePaths(v, [...path, Array.isArray(value) ? Number(k) : k], out, depth + 1);
  }
  return out;
}

function replaceAt(value: unknown, pick: number, replacement: unknown): unknown {
  const paths = nodePaths(value);
  const path = paths[pick % paths.length]!;
  if (!path.length) return replacement;
  const copy = structuredClone(value) as Record<string | number, unknown>;
  let node = copy;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, unknown>;
  node[path.at(-1)!] = replacement;
  return copy;
}

/** A near-valid value: drawn from the schema, sometimes with one node made hostile. */
const nearValid = (schema: JsonSchema | undefined) =>
  fc.oneof(
    { weight: 2, arbitrary: fromSchema(schema) },
    { weight: 3, arbitrary: fc.tuple(fromSchema(schema), hostileValue, fc.nat()).map(([v, h, n]) => replaceAt(v, n, h)) },
  );

// ---------- requests ----------

const queryText = (v: unknown) => encodeURIComponent(typeof v === 'string' ? v.replace(/[\ud800-\udfff]/g, '\ufffd') : JSON.stringify(v) ?? '');

function pathArb(op: Operation): fc.Arbitrary<string> {
  const segments = op.pathParams.map((p) =>
    fc.oneof(
      { weight: 5, arbitrary: realValues[p.name]?.length ? fc.constantFrom(...realValues[p.name]!) : fromSchema(p.schema).map((v) => encodeURIComponent(String(v))) },
      { weight: 2, arbitrary: fromSchema(p.schema).map((v) => encodeURIComponent(String(v))) },
      { weight: 3, arbitrary: hostileSegment },
    ),
  );
  return fc.tuple(...segments).map((values) => {
    let i = 0;
    return op.path.replace(/\{\w+\}/g, () => values[i++]!);
  });
}

function queryArb(op: Operation): fc.Arbitrary<string> {
  if (!op.query.length) return fc.oneof(fc.constant(''), fc.constantFrom('?x=1', '?%E0%A4%A=1', '?a[b][c]=1', '?=', '?&&', '?limit=0x10'));
  const params = op.query.map((q) =>
    fc
      .oneof(
        { weight: q.required ? 1 : 4, arbitrary: fc.constant<string[]>([]) },
        { weight: 6, arbitrary: fromSchema(q.schema).map((v) => [`${q.name}=${queryText(v)}`]) },
        { weight: 3, arbitrary: hostileQueryValue.map((v) => [`${q.name}=${v}`]) },
        { weight: 1, arbitrary: fc.tuple(fromSchema(q.schema), fromSchema(q.schema)).map(([a, b]) => [`${q.name}=${queryText(a)}`, `${q.name}=${queryText(b)}`]) },
        { weight: 1, arbitrary: fc.constant([`${q.name}[a]=1`, `${q.name}[]=2`]) },
      )
      .map((parts) => parts),
  );
  return fc.tuple(...params).map((parts) => {
    const flat = parts.flat();
    return flat.length ? `?${flat.join('&')}` : '';
  });
}

/** Percent-encodes what an HTTP client may not put in a request line (spaces, controls, non-ASCII). */
const printable = (url: string) => url.replace(/[^\x21-\x7e]/g, (c) => encodeURIComponent(c.replace(/[\ud800-\udfff]/g, '\ufffd')));

const json = (v: unknown) => Buffer.from(JSON.stringify(v) ?? 'null');

/** Bodies for an operation: mostly JSON near the schema, plus every kind of wrong body. */
function bodyArb(op: Operation, hostileOnly: boolean): fc.Arbitrary<{ kind: string; contentType?: string; body?: Buffer }> {
  const schema = op.json ?? op.multipart;
  const wrong = [
    { weight: 2, arbitrary: nearValid(schema).map((v) => ({ kind: 'text/plain', contentType: 'text/plain', body: json(v) })) },
    { weight: 1, arbitrary: fc.constant({ kind: 'form', contentType: 'application/x-www-form-urlencoded', body: Buffer.from('email=a%40b.example&password=x&name=%E0%A4%A') }) },
    { weight: 1, arbitrary: fc.constantFrom('{', '{"a":', '[1,]', "{'a':1}", 'nul', '\u0000', '{"a":1}{"b":2}', '"\\ud800"').map((b) => ({ kind: 'malformed json', contentType: 'application/json', body: Buffer.from(b) })) },
    { weight: 1, arbitrary: fc.integer({ min: 1000, max: 20_000 }).map((d) => ({ kind: 'deeply nested', contentType: 'application/json', body: Buffer.from(`{"name":${deepArray(d)},"x":${deepArray(d)}}`) })) },
    { weight: 1, arbitrary: fc.constantFrom('application/json; charset=latin1', 'application/json; charset=utf-16', 'application/merge-patch+json', 'application/xml', 'image/png', 'multipart/form-data; boundary=x').map((ct) => ({ kind: 'odd content type', contentType: ct, body: Buffer.from('{"a":"b"}') })) },
    { weight: 1, arbitrary: fc.constant(0).map(() => ({ kind: 'no content type', body: Buffer.from('{"name":"x"}') })) },
    { weight: 1, arbitrary: fc.constant({ kind: 'huge', contentType: 'application/json', body: HUGE_BODY }) },
    { weight: 2, arbitrary: fromSchema(schema).map((v) => ({ kind: 'lone surrogate', contentType: 'application/json', body: json({ ...(v && typeof v === 'object' && !Array.isArray(v) ? v : {}), name: 'a\ud800b', '\udc00': 'x' }) })) },
  ];
  const mutated = { weight: 3, arbitrary: nearValid(schema).map((v) => ({ kind: 'json (mutated)', contentType: 'application/json', body: json(v) })) };
  if (hostileOnly) return fc.oneof(...wrong);
  if (op.multipart) {
    const multipart = fc
      .tuple(nearValid(op.multipart), fc.constantFrom<[Buffer, string]>([pdfBytes('Fuzz'), 'application/pdf'], [PNG_BYTES, 'image/png'], [Buffer.from('#!/bin/sh\nexit 0\n'), 'application/pdf'], [Buffer.alloc(0), 'text/plain']), fc.constantFrom('file', 'upload', ''), fc.constantFrom('a.pdf', '..%2F..%2Fx.pdf', '\u{1F525}.png', 'x'.repeat(300)))
      .map(([fields, [bytes, type], field, filename]) => {
        const boundary = 'fuzzboundary7MA4YWxkTrZu0gW';
        const parts: Buffer[] = [];
        for (const [k, v] of Object.entries(fields && typeof fields === 'object' ? fields : { kind: fields })) {
          parts.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${k.replace(/["\r\n]/g, '')}"\r\n\r\n${typeof v === 'string' ? v : JSON.stringify(v)}\r\n`));
        }
        if (field) parts.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${field}"; filename="${filename}"\r\nContent-Type: ${type}\r\n\r\n`), bytes, Buffer.from('\r\n'));
        parts.push(Buffer.from(`--${boundary}--\r\n`));
        return { kind: 'multipart', contentType: `multipart/form-data; boundary=${boundary}`, body: Buffer.concat(parts) };
      });
    const truncated = fc.constant({ kind: 'multipart (truncated)', contentType: 'multipart/form-data; boundary=zz', body: Buffer.from('--zz\r\nContent-Disposition: form-data; name="kind"\r\n\r\ninsur') });
    return fc.oneof({ weight: 8, arbitrary: multipart }, { weight: 1, arbitrary: truncated }, ...wrong);
  }
  if (!op.json) return fc.oneof({ weight: 12, arbitrary: fc.constant({ kind: 'none' }) }, ...wrong);
  return fc.oneof({ weight: 6, arbitrary: fromSchema(op.json).map((v) => ({ kind: 'json (from schema)', contentType: 'application/json', body: json(v) })) }, mutated, ...wrong);
}

const authorisation = (caller: CallerName) =>
  caller === 'anonymous'
    ? fc.constantFrom(undefined, undefined, undefined, 'Bearer ', 'Bearer not.a.token', 'Basic YWRtaW46YWRtaW4=', 'Bearer eyJhbGciOiJub25lIn0.eyJzdWIiOiJ4In0.')
    : fc.constant(`Bearer ${callers[caller]!.accessToken}`);

const HUGE_BODY = Buffer.from(`{"name":"${'x'.repeat(1_100_000)}"}`);

function requestArb(op: Operation): fc.Arbitrary<FuzzRequest> {
  const names: CallerName[] = ['anonymous', 'owner', 'partnerAdmin', 'technician', 'networkAdmin'];
  const path = pathArb(op);
  const query = queryArb(op);
  const body = bodyArb(op, false);
  // the network admin of the shared seed only reads, or sends bodies that cannot be accepted
  const hostileBody = op.method === 'get' ? body : bodyArb(op, true);
  return fc.oneof(
    ...names.map((caller) =>
      fc.record({ auth: authorisation(caller), path, query, body: caller === 'networkAdmin' ? hostileBody : body }).map(({ auth, path, query, body }) => ({
        op,
        caller,
        authorization: auth,
        url: printable(path + query),
        contentType: body.contentType,
        body: body.body,
        bodyKind: body.kind,
      })),
    ),
  );
}

interface Answer {
  status: number;
  contentType: string;
  text: string;
}

function send(r: FuzzRequest): Promise<Answer> {
  return new Promise((resolveAnswer, reject) => {
    const headers: http.OutgoingHttpHeaders = {};
    if (r.authorization) headers.authorization = r.authorization;
    if (r.contentType) headers['content-type'] = r.contentType;
    if (r.body) headers['content-length'] = r.body.length;
    const req = http.request({ ...base, agent, method: r.op.method.toUpperCase(), path: r.url, headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolveAnswer({ status: res.statusCode ?? 0, contentType: String(res.headers['content-type'] ?? ''), text: Buffer.concat(chunks).toString('utf8') }));
      res.on('error', reject);
    });
    req.on('error', reject);
    // a request that hangs is a finding too, not a reason for the run to stall
    req.setTimeout(10_000, () => req.destroy(new Error('no answer within 10 s')));
    req.end(r.body);
  });
}

const STACK_TRACE = /\n\s+at [\w$.<>[\] ]+ \(|\bat (?:Object|Module|process)\.|node:internal|[\\/]node_modules[\\/]|[\\/]apps[\\/]api[\\/]src[\\/]/;

/** Why an answer breaks the contract, or undefined if it keeps it. */
function violation(a: Answer): string | undefined {
  if (a.status >= 500 || a.status < 200) return `status ${a.status}`;
  // Node's HTTP parser answers an over-long request line itself, before any of our code runs
  if (a.status === 431 && !a.text) return undefined;
  if (STACK_TRACE.test(a.text)) return 'stack trace or server path in the body';
  if (a.status >= 400) {
    if (!a.contentType.startsWith('application/problem+json')) return `4xx with content type ${a.contentType}`;
    let problem: { status?: unknown; code?: unknown; title?: unknown; type?: unknown };
    try {
      problem = JSON.parse(a.text);
    } catch {
      return '4xx body is not JSON';
    }
    if (problem.status !== a.status || typeof problem.code !== 'string' || typeof problem.title !== 'string' || typeof problem.type !== 'string') return '4xx body is not problem details';
  }
  return undefined;
}

/** Every /api operation of the OpenAPI document (the payments webhook too: it is public). */
function readOperations(): void {
  for (const [path, item] of Object.entries(doc.paths)) {
    for (const [method, spec] of Object.entries(item)) {
      if (!['get', 'post', 'put', 'patch', 'delete'].includes(method)) continue;
      const parameters = spec.parameters ?? [];
      const content = spec.requestBody?.content ?? {};
      operations.push({
        method: method as Operation['method'],
        path,
        pathParams: [...path.matchAll(/\{(\w+)\}/g)].map((m) => ({ name: m[1]!, schema: parameters.find((p) => p.in === 'path' && p.name === m[1])?.schema ?? { type: 'string' } })),
        query: parameters.filter((p) => p.in === 'query').map((p) => ({ name: p.name, schema: p.schema, required: !!p.required })),
        json: content['application/json']?.schema,
        multipart: content['multipart/form-data']?.schema,
        needsAuth: !!spec.security?.some((s) => Object.keys(s).length > 0) && !spec.security?.some((s) => Object.keys(s).length === 0),
      });
    }
  }
}

async function collectRealValues(partner: Awaited<ReturnType<typeof partnerWithTeam>>): Promise<void> {
  const ids = async (sql: string, params: unknown[] = []) => ((await t.dataSource.query(sql, params)) as { v: string }[]).map((r) => String(r.v));
  const own = partner.orgId;
  realValues.orgId = [own, own, ...(await ids("SELECT id AS v FROM organisation WHERE status = 'approved' ORDER BY id LIMIT 2"))];
  realValues.partnerId = await ids("SELECT id AS v FROM organisation WHERE status = 'approved' ORDER BY id LIMIT 3");
  realValues.bookingId = await ids('SELECT id AS v FROM booking ORDER BY id LIMIT 3');
  realValues.offerId = await ids('SELECT id AS v FROM offer ORDER BY organisation_id = ? DESC, id LIMIT 3', [own]);
  realValues.partId = await ids('SELECT id AS v FROM part ORDER BY organisation_id = ? DESC, id LIMIT 3', [own]);
  realValues.documentId = await ids('SELECT id AS v FROM partner_document ORDER BY organisation_id = ? DESC, id LIMIT 3', [own]);
  realValues.invitationId = await ids('SELECT id AS v FROM invitation ORDER BY organisation_id = ? DESC, id LIMIT 2', [own]);
  realValues.userId = [partner.technician!.userId, partner.admin.userId];
  realValues.vehicleId = await ids('SELECT id AS v FROM vehicle WHERE owner_user_id = ? LIMIT 2', [callers.owner!.userId]);
  realValues.code = [...(await ids('SELECT code AS v FROM service_type ORDER BY code LIMIT 3')), ...(await ids('SELECT code AS v FROM capability ORDER BY code LIMIT 2'))];
  for (const [k, v] of Object.entries(realValues)) if (!v.length) delete realValues[k];
}

beforeAll(async () => {
  payments = await startPaymentsFake();
  // limits far above what the fuzzer sends, so answers are about input, not about 429
  const generous = Object.fromEntries(Object.entries(DEFAULT_LIMITS).map(([k, v]) => [k, Object.fromEntries(Object.entries(v).map(([f, n]) => [f, f === 'windowMinutes' ? n : 1_000_000]))])) as unknown as LimitSettings;
  t = await createTestApp(payments.env, { limits: generous });
  const partner = await partnerWithTeam(t.app, t.dataSource, { technician: true });
  callers.partnerAdmin = partner.admin;
  callers.technician = partner.technician!;
  callers.owner = await signUpAndVerify(t.app, t.dataSource, 'owner');
  callers.networkAdmin = await networkAdmin(t.app);
  await request(t.app)
    .post('/api/me/vehicles')
    .set('authorization', `Bearer ${callers.owner.accessToken}`)
    .send({ name: 'Fuzz van', model: 'Korvan Cargo 4', year: 2022, fuel: 'diesel', factoryHeater: 'coolant_auxiliary', climateControl: 'automatic', electricalSystemV: 12, batteryCapacityAh: 95, batteryType: 'agm' })
    .expect(201);
  doc = (await request(t.app).get('/api/openapi.json').expect(200)).body;
  readOperations();
  await collectRealValues(partner);
  server = http.createServer(t.app).listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  base = { host: '127.0.0.1', port: (server.address() as AddressInfo).port };
  agent = new http.Agent({ keepAlive: true, maxSockets: CONCURRENCY });
}, 60_000);

afterAll(async () => {
  agent?.destroy();
  await new Promise((r) => server?.close(r));
  await payments?.idle();
  await t?.close();
  await payments?.close();
});

describe('fuzzing every operation of the OpenAPI document', () => {
  it('finds the operations and can call each one', () => {
    expect(operations.length).toBeGreaterThanOrEqual(60);
    expect(operations.some((o) => o.multipart)).toBe(true);
    expect(operations.some((o) => o.query.length)).toBe(true);
  });

  it(`answers ${REQUESTS} seeded requests with 2xx/3xx or 4xx problem details, never 5xx or a stack trace`, async () => {
    const started = Date.now();
    // built once: drawing from prebuilt arbitraries is cheap, building them per request is not
    const opArb = fc.oneof(...operations.map(requestArb));
    const statuses = new Map<number, number>();
    const kinds = new Map<string, number>();
    const latency = new Map<string, number>();
    const perOperation = new Map<string, { sent: number; success: number }>();
    const failures: string[] = [];
    let sent = 0;
    for (let batch = 0; sent < REQUESTS; batch++) {
      const requests = fc.sample(opArb, { seed: SEED + batch, numRuns: Math.min(BATCH, REQUESTS - sent) });
      let next = 0;
      await Promise.all(
        Array.from({ length: CONCURRENCY }, async () => {
          while (next < requests.length) {
            const r = requests[next++]!;
            const t1 = Date.now();
            const answer = await send(r).catch((err: Error) => ({ status: 0, contentType: '', text: `request failed: ${err.message}` }));
            sent++;
            statuses.set(answer.status, (statuses.get(answer.status) ?? 0) + 1);
            kinds.set(r.bodyKind, (kinds.get(r.bodyKind) ?? 0) + 1);
            if (process.env.FUZZ_DEBUG) latency.set(r.bodyKind, (latency.get(r.bodyKind) ?? 0) + Date.now() - t1);
            const key = `${r.op.method.toUpperCase()} ${r.op.path}`;
            const entry = perOperation.get(key) ?? { sent: 0, success: 0 };
            entry.sent++;
            if (answer.status < 300) entry.success++;
            perOperation.set(key, entry);
            const why = violation(answer);
            if (why) failures.push(`${why}: ${r.op.method.toUpperCase()} ${r.url.slice(0, 200)} as ${r.caller} with ${r.bodyKind}${r.body ? ` ${r.body.subarray(0, 160).toString('utf8')}` : ''} -> ${answer.text.slice(0, 300)}`);
          }
        }),
      );
    }
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    const byStatus = [...statuses.entries()].sort((a, b) => a[0] - b[0]).map(([s, n]) => `${s}: ${n}`).join(', ');
    const reached = [...perOperation.values()].filter((o) => o.success > 0).length;
    console.log(
      [
        `fuzz: seed ${SEED}, ${sent} requests to ${perOperation.size} of ${operations.length} operations in ${seconds} s`,
        `fuzz: by status ${byStatus}`,
        `fuzz: by body ${[...kinds.entries()].map(([k, n]) => `${k}: ${n}`).join(', ')}`,
        `fuzz: ${reached} operations answered at least one 2xx; ${failures.length} violations`,
      ].join('\n'),
    );
    if (process.env.FUZZ_DEBUG) console.log([...latency.entries()].map(([k, ms]) => `${k}: ${(ms / kinds.get(k)!).toFixed(1)} ms`).join(', '));
    expect(failures.slice(0, 20), `${failures.length} answers broke the contract (seed ${SEED})`).toEqual([]);
    expect(sent).toBeGreaterThanOrEqual(REQUESTS);
    expect(perOperation.size, 'every operation was called').toBe(operations.length);
  }, 150_000);
});
