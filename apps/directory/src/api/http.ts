// The Directory's HTTP clients (same origin): `http` with the bearer token and one refresh on 401,
// `authHttp` for /api/auth/*. The session store connects itself, so there is no import cycle.
import { createSessionClients } from '@emberline/api-client';
import { appConfig } from '@/app-config';

export const { http, authHttp, connectSession } = createSessionClients(appConfig.apiBaseUrl);
