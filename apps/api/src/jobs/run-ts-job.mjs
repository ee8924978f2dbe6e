// Bree worker entry (Bree loads only .js/.mjs): registers tsx, then imports the job's `<name>.ts`.
import { fileURLToPath } from 'node:url';
import { workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

const name = workerData?.job?.name;
// the name picks a file next to this one, so only plain job names are accepted
if (typeof name !== 'string' || !/^[a-z][a-z0-9-]*$/.test(name)) throw new Error(`Not a job name: ${String(name)}`);

// tsx reads decorator settings from this tsconfig (TypeORM entities need them)
register({ tsconfig: fileURLToPath(new URL('../../../../tsconfig.json', import.meta.url)) });
await import(new URL(`./${name}.ts`, import.meta.url).href);
