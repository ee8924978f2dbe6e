// Serves the built apps, sending the brotli or gzip copy made at build time to clients that take it.
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Request, type RequestHandler, type Response } from 'express';

/** Server preference: brotli is smaller; gzip is what every client takes. */
const ENCODINGS = [
  { name: 'br', suffix: '.br' },
  { name: 'gzip', suffix: '.gz' },
] as const;

/**
 * The file to send for `file`: a precompressed copy the client accepts (q > 0), or the file itself.
 * Sets Content-Type from the original name and Vary whenever copies exist, so a shared cache
 * keeps the encodings apart.
 */
function chooseVariant(req: Request, res: Response, file: string): string | null {
  const present = ENCODINGS.filter((e) => existsSync(file + e.suffix));
  if (!present.length) return null;
  res.vary('Accept-Encoding');
  const chosen = present.find((e) => req.acceptsEncodings(e.name) === e.name);
  if (!chosen) return null;
  res.type(path.extname(file));
  res.setHeader('Content-Encoding', chosen.name);
  return file + chosen.suffix;
}

const isHtml = (file: string) => /\.html(\.br|\.gz)?$/.test(file);

/**
 * express.static over `root` that prefers the precompressed copies. serve-static still does the
 * rest (ETag and 304, Range, HEAD) on the file it sends; HTML is always revalidated.
 */
export function precompressedStatic(root: string, options: { maxAge: string; immutable?: boolean }): RequestHandler {
  const serve = express.static(root, {
    index: false,
    maxAge: options.maxAge,
    immutable: options.immutable ?? false,
    setHeaders: (res, file) => {
      if (isHtml(file)) res.setHeader('Cache-Control', 'no-cache');
    },
  });
  const base = path.resolve(root);
  return (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return serve(req, res, next);
    const queryAt = req.url.indexOf('?');
    const urlPath = queryAt === -1 ? req.url : req.url.slice(0, queryAt);
    let file: string;
    try {
      file = path.join(base, decodeURIComponent(urlPath));
    } catch {
      // a malformed path: serve-static answers it as it always has
      return serve(req, res, next);
    }
    if (!file.startsWith(base + path.sep) || !existsSync(file)) return serve(req, res, next);
    const variant = chooseVariant(req, res, file);
    if (variant) req.url = urlPath + variant.slice(file.length) + (queryAt === -1 ? '' : req.url.slice(queryAt));
    return serve(req, res, next);
  };
}

/** Sends one HTML page (the apps' entry pages), precompressed where possible, always revalidated. */
export function sendPage(req: Request, res: Response, file: string, onError: (err: Error) => void): void {
  const variant = existsSync(file) ? chooseVariant(req, res, file) : null;
  res.set('cache-control', 'no-cache').sendFile(variant ?? file, (err) => {
    if (err) onError(err);
  });
}
