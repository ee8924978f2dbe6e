// The Directory's one HTTP client (same origin); sign-in tokens arrive with accounts.
import { createHttpClient } from '@emberline/api-client';
import { appConfig } from '@/app-config';

export const http = createHttpClient({ baseUrl: appConfig.apiBaseUrl });
