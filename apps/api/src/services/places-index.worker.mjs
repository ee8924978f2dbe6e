// Worker thread entry (plain JavaScript, as workers load only .js/.mjs): registers tsx, builds
// the place index and hands it to the API thread, typed arrays transferred rather than copied.
import { fileURLToPath } from 'node:url';
import { parentPort } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register({ tsconfig: fileURLToPath(new URL('../../../../tsconfig.json', import.meta.url)) });
const { buildPlaceIndex } = await import(new URL('./places-index.ts', import.meta.url).href);
const index = buildPlaceIndex();
parentPort.postMessage(index, [index.ids.buffer, index.lat.buffer, index.lng.buffer, index.population.buffer, index.keyCity.buffer]);
