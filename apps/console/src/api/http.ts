// The Console's one HTTP client (same origin); bearer token and refresh arrive with accounts.
import { createHttpClient } from '@emberline/api-client';
import { appConfig } from '@/app-config';

export const http = createHttpClient({ baseUrl: appConfig.apiBaseUrl });
