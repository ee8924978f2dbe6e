// Every migration, in order. Add new ones at the end.
import { Catalogue1764620000000 } from './1764620000000-catalogue';
import { Accounts1764630000000 } from './1764630000000-accounts';
import { Vehicles1764640000000 } from './1764640000000-vehicles';
import { Onboarding1764650000000 } from './1764650000000-onboarding';
import { Offers1764660000000 } from './1764660000000-offers';
import { Search1764670000000 } from './1764670000000-search';
import { Bookings1764680000000 } from './1764680000000-bookings';
import { SearchIndex1764690000000 } from './1764690000000-search-index';
import { RateLimits1764913310000 } from './1764913310000-rate-limits';
import { MailOutboxSecrets1764914130000 } from './1764914130000-mail-outbox-secrets';
import { SignInThrottle1764920000000 } from './1764920000000-sign-in-throttle';
import { DropFailedSignIns1764930000000 } from './1764930000000-drop-failed-sign-ins';
import { JobStartWindow1764951000000 } from './1764951000000-job-start-window';

export const migrations = [Catalogue1764620000000, Accounts1764630000000, Vehicles1764640000000, Onboarding1764650000000, Offers1764660000000, Search1764670000000, Bookings1764680000000, SearchIndex1764690000000, RateLimits1764913310000, MailOutboxSecrets1764914130000, SignInThrottle1764920000000, DropFailedSignIns1764930000000, JobStartWindow1764951000000];
