// Every migration, in order. Add new ones at the end.
import { Catalogue1764620000000 } from './1764620000000-catalogue';

export const migrations = [Catalogue1764620000000];
