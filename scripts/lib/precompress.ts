// Writes brotli and gzip copies beside the built text files (`x.js.br`, `x.js.gz`), so the API
// sends them as they are instead of compressing on every request. Used by the Vite build.
import { readdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';

/** The text files worth compressing; images and fonts are compressed formats already. */
export const PRECOMPRESSIBLE = /\.(html|js|mjs|css|svg|json|txt|xml|webmanifest)$/;
const brotli = promisify(brotliCompress);
const gzipAsync = promisify(gzip);

export interface PrecompressReport {
  files: number;
  bytes: number;
  brotliBytes: number;
  gzipBytes: number;
}

async function* filesUnder(dir: string): AsyncGenerator<string> {
  for (const entry of await readdir(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) yield* filesUnder(full);
    else if (entry.isFile() && PRECOMPRESSIBLE.test(entry.name)) yield full;
  }
}

/** Compresses every text file under `dir`; a copy that would not be smaller is not written. */
export async function precompressDir(dir: string): Promise<PrecompressReport> {
  const report: PrecompressReport = { files: 0, bytes: 0, brotliBytes: 0, gzipBytes: 0 };
  const jobs: Promise<void>[] = [];
  for await (const file of filesUnder(dir)) {
    jobs.push(
      (async () => {
        const content = await readFile(file);
        const [br, gz] = await Promise.all([
          brotli(content, { params: { [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY, [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT, [constants.BROTLI_PARAM_SIZE_HINT]: content.length } }),
          gzipAsync(content, { level: constants.Z_BEST_COMPRESSION }),
        ]);
        report.files++;
        report.bytes += content.length;
        report.brotliBytes += Math.min(br.length, content.length);
        report.gzipBytes += Math.min(gz.length, content.length);
        if (br.length < content.length) await writeFile(`${file}.br`, br);
        if (gz.length < content.length) await writeFile(`${file}.gz`, gz);
      })(),
    );
  }
  await Promise.all(jobs);
  return report;
}
