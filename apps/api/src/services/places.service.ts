// Place names for the search box: GeoNames cities (population 1,000 or more) found by a prefix
// of their name, case- and accent-insensitively ("munchen", "tromso"). The index is built once,
// in a worker thread, on the first look-up (or when the server warms it).
import { Worker } from 'node:worker_threads';
import type { Place } from '@emberline/domain';
import { normalisePlaceName, type PlaceIndex } from './places-index';
import { lowerBound } from '../lib/sorted';

let loading: Promise<PlaceIndex> | null = null;

/** The index, built by a worker the first time; a failed build is tried again on the next call. */
export function loadPlaces(): Promise<PlaceIndex> {
  loading ??= new Promise<PlaceIndex>((resolve, reject) => {
    const worker = new Worker(new URL('./places-index.worker.mjs', import.meta.url));
    worker.once('message', (index: PlaceIndex) => {
      resolve(index);
      void worker.terminate();
    });
    worker.once('error', reject);
    worker.once('exit', (code) => reject(new Error(`The place index worker stopped (exit code ${code})`)));
  }).catch((err: unknown) => {
    loading = null;
    throw err;
  });
  return loading;
}

/**
 * Cities whose name (or another name) starts with the typed text: a whole-name match first, then
 * by population, largest first; each city once. One pass
 * over the matching keys keeps the best `limit` (short prefixes match tens of thousands).
 */
export async function findPlaces(q: string, limit: number): Promise<Place[]> {
  const idx = await loadPlaces();
  const prefix = normalisePlaceName(q);
  if (!prefix) return [];
  // populations are below 1e10, so a whole-name match outranks any prefix match
  const top: { city: number; score: number }[] = [];
  for (let i = lowerBound(idx.keys, prefix); i < idx.keys.length && idx.keys[i]!.startsWith(prefix); i++) {
    const key = idx.keys[i]!;
    const city = idx.keyCity[i]!;
    const score = (key.length === prefix.length ? 1e10 : 0) + idx.population[city]!;
    const seen = top.findIndex((t) => t.city === city);
    if (seen >= 0) {
      if (top[seen]!.score >= score) continue;
      top.splice(seen, 1);
    } else if (top.length >= limit && score <= top[top.length - 1]!.score) continue;
    let at = top.length;
    while (at > 0 && (top[at - 1]!.score < score || (top[at - 1]!.score === score && idx.ids[top[at - 1]!.city]! > idx.ids[city]!))) at--;
    top.splice(at, 0, { city, score });
    if (top.length > limit) top.pop();
  }
  return top.map(({ city }) => ({
    id: idx.ids[city]!,
    name: idx.names[city]!,
    country: idx.countries[city]!,
    lat: idx.lat[city]!,
    lng: idx.lng[city]!,
    population: Math.round(idx.population[city]!),
  }));
}
