// What createApp is given (AppDeps) and what it hands to route modules and controllers
// (AppContext). Kept apart from app.ts so controllers need not import the app that mounts them.
import type { DataSource } from 'typeorm';
import type { Config } from './config';
import type { Logger } from './lib/logger';
import type { Guards } from './middleware/auth';
import type { LimitSettings, Limiters } from './middleware/rate-limits';
import type { AuthSettings } from './services/auth.service';
import type { Storage } from './storage';
import type { PaymentGateway } from './payments/gateway';

export interface AppDeps {
  config: Config;
  dataSource: DataSource;
  logger: Logger;
  version: string;
  /** Signs access tokens; from JWT_SECRET, or generated into var/ in development. */
  jwtSecret: string;
  limits?: Partial<LimitSettings>;
  /** Where uploaded documents go; by default the driver the configuration names (tests pass a temporary directory). */
  storage?: Storage;
  /** Prefix of this app's rate-limit counters in the database; instances sharing it share limits (tests give each app its own). */
  limitScope?: string;
  /** The payments provider; by default the SDK against the configured API base (tests pass one at a local fake). */
  payments?: PaymentGateway;
}

/** What route modules and controllers get: the dependencies plus what createApp builds from them. */
export interface AppContext extends AppDeps {
  storage: Storage;
  payments: PaymentGateway;
  authSettings: AuthSettings;
  limiters: Limiters;
  guards: Guards;
}
