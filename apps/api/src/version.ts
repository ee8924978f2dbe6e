// The running version, from the root package.json.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { projectRoot } from './config';

export const VERSION: string = (JSON.parse(readFileSync(path.join(projectRoot, 'package.json'), 'utf8')) as { version: string }).version;
