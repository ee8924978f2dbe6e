// The API as the search benchmark runs it, in its own process: the real app on the bench
// database, with the per-IP limits of the public routes and sign-in lifted (one machine sends every request).
import { createApp } from '../../apps/api/src/app';
import { loadConfig } from '../../apps/api/src/config';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { createLogger } from '../../apps/api/src/lib/logger';

const config = loadConfig();
const dataSource = await createDataSource(config).initialize();
const unlimited = { perIp: 1e9, windowMinutes: 1 };
const app = createApp({ config, dataSource, logger: createLogger(config.LOG_LEVEL), version: 'bench', jwtSecret: 'bench-secret-bench-secret-bench-secret-0123', limits: { search: unlimited, places: unlimited, signIn: { ...unlimited, perAccount: 1e9 } } });
const server = app.listen(config.PORT, config.HOST, () => console.log(`bench server ready on ${config.PORT}`));
process.on('SIGTERM', () => server.close(() => void dataSource.destroy().then(() => process.exit(0))));
