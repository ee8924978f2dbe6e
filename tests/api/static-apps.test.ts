// The built apps and API answers go out compressed: precompressed brotli or gzip copies by
// Accept-Encoding, with the caching, ETag, Range and security headers intact.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { precompressDir } from '../../scripts/lib/precompress';
import { createTestApp, type TestApp } from '../setup/app';

interface Raw {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: Buffer;
}

let dir: string;
let served: TestApp;
let server: http.Server;
let port: number;

/** A request whose answer is read byte for byte, never decoded by the client. */
function get(urlPath: string, headers: Record<string, string> = {}): Promise<Raw> {
  return new Promise((resolve, reject) => {
    http
      .get({ host: '127.0.0.1', port, path: urlPath, headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }));
      })
      .on('error', reject);
  });
}
const decoded = (r: Raw) =>
  r.headers['content-encoding'] === 'br' ? brotliDecompressSync(r.body) : r.headers['content-encoding'] === 'gzip' ? gunzipSync(r.body) : r.body;

const script = `export const rows = [${Array.from({ length: 400 }, (_, i) => `{ id: ${i}, label: 'row ${i}' }`).join(', ')}];\n`;
const page = `<!doctype html><html lang="en"><head><title>directory</title><script type="module" src="/assets/app-1a2b.js"></script></head><body>${'<p>first paint</p>'.repeat(100)}</body></html>`;

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), 'emberline-apps-'));
  mkdirSync(path.join(dir, 'assets'));
  mkdirSync(path.join(dir, 'apps/console'), { recursive: true });
  writeFileSync(path.join(dir, 'index.html'), page);
  writeFileSync(path.join(dir, 'apps/console/index.html'), page.replace('directory', 'console'));
  writeFileSync(path.join(dir, 'assets/app-1a2b.js'), script);
  writeFileSync(path.join(dir, 'assets/tiny-9f.js'), 'x');
  // as the build makes them
  await precompressDir(dir);
  served = await createTestApp({ SERVE_APPS: 'true', APPS_DIR: dir });
  server = served.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  port = (server.address() as AddressInfo).port;
});

afterAll(async () => {
  await new Promise((r) => server?.close(r));
  await served?.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('built assets', () => {
  it('sends the brotli copy to a client that takes it, typed and cached as the file', async () => {
    const r = await get('/assets/app-1a2b.js', { 'accept-encoding': 'gzip, deflate, br' });
    expect(r.status).toBe(200);
    expect(r.headers['content-encoding']).toBe('br');
    expect(r.headers.vary).toMatch(/accept-encoding/i);
    expect(r.headers['content-type']).toMatch(/^(text|application)\/javascript/);
    expect(r.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(r.body.length).toBeLessThan(script.length / 4);
    expect(decoded(r).toString()).toBe(script);
    expect(r.headers['content-security-policy']).toContain("default-src 'self'");
    expect(r.headers['x-content-type-options']).toBe('nosniff');
  });

  it('sends gzip where brotli is not taken, and the file itself where neither is', async () => {
    const br = await get('/assets/app-1a2b.js', { 'accept-encoding': 'br' });
    const gz = await get('/assets/app-1a2b.js', { 'accept-encoding': 'br;q=0, gzip' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(decoded(gz).toString()).toBe(script);
    const plain = await get('/assets/app-1a2b.js', { 'accept-encoding': 'identity' });
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.toString()).toBe(script);
    expect(plain.headers.vary).toMatch(/accept-encoding/i);
    expect(plain.headers['content-type']).toBe(br.headers['content-type']);
    expect(gz.headers['content-type']).toBe(br.headers['content-type']);
  });

  it('answers 304 to a matching ETag, per encoding', async () => {
    const first = await get('/assets/app-1a2b.js', { 'accept-encoding': 'br' });
    expect(first.headers.etag).toBeTruthy();
    const again = await get('/assets/app-1a2b.js', { 'accept-encoding': 'br', 'if-none-match': first.headers.etag! });
    expect(again.status).toBe(304);
    const plain = await get('/assets/app-1a2b.js');
    expect(plain.headers.etag).not.toBe(first.headers.etag);
  });

  it('answers Range requests on the bytes it sends', async () => {
    const plain = await get('/assets/app-1a2b.js', { range: 'bytes=0-9' });
    expect(plain.status).toBe(206);
    expect(plain.body.toString()).toBe(script.slice(0, 10));
    const full = await get('/assets/app-1a2b.js', { 'accept-encoding': 'br' });
    const part = await get('/assets/app-1a2b.js', { 'accept-encoding': 'br', range: 'bytes=0-9' });
    expect(part.status).toBe(206);
    expect(part.headers['content-encoding']).toBe('br');
    expect(part.body).toEqual(full.body.subarray(0, 10));
  });

  it('sends a file too small to compress as it is', async () => {
    const r = await get('/assets/tiny-9f.js', { 'accept-encoding': 'br, gzip' });
    expect(r.status).toBe(200);
    expect(r.headers['content-encoding']).toBeUndefined();
    expect(r.body.toString()).toBe('x');
  });
});

describe('app pages', () => {
  it('sends each entry page compressed and always revalidated', async () => {
    for (const [url, file] of [['/', 'index.html'], ['/search?place=Graz', 'index.html'], ['/console/bookings', 'apps/console/index.html'], ['/index.html', 'index.html']] as const) {
      const r = await get(url, { 'accept-encoding': 'br, gzip' });
      expect(r.status, url).toBe(200);
      expect(r.headers['content-encoding'], url).toBe('br');
      expect(r.headers['content-type'], url).toMatch(/^text\/html/);
      expect(r.headers['cache-control'], url).toBe('no-cache');
      expect(r.headers.vary, url).toMatch(/accept-encoding/i);
      expect(decoded(r).toString(), url).toBe(readFileSync(path.join(dir, file), 'utf8'));
    }
    const plain = await get('/console/bookings');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.toString()).toBe(readFileSync(path.join(dir, 'apps/console/index.html'), 'utf8'));
  });
});

describe('API answers', () => {
  it('compresses the OpenAPI document by Accept-Encoding', async () => {
    const plain = await get('/api/openapi.json');
    expect(plain.headers['content-encoding']).toBeUndefined();
    for (const encoding of ['br', 'gzip']) {
      const r = await get('/api/openapi.json', { 'accept-encoding': encoding });
      expect(r.status).toBe(200);
      expect(r.headers['content-encoding']).toBe(encoding);
      expect(r.headers.vary).toMatch(/accept-encoding/i);
      expect(r.body.length).toBeLessThan(plain.body.length / 5);
      expect(JSON.parse(decoded(r).toString())).toEqual(JSON.parse(plain.body.toString()));
    }
  });
});
