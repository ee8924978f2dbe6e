// The one HTTP client: JSON in and out, bearer token, one retry after a refresh on 401,
// RFC 9457 problem details turned into ApiError.
import { ProblemDetailsSchema, type ProblemDetails } from '@emberline/domain';
import type { z } from 'zod';

export class ApiError extends Error {
  readonly status: number;
  readonly problem: ProblemDetails;
  constructor(problem: ProblemDetails) {
    super(problem.detail ?? problem.title);
    this.name = 'ApiError';
    this.status = problem.status;
    this.problem = problem;
  }
  /** Field errors keyed by path, ready for a form. */
  get fieldErrors(): Record<string, string> {
    const out: Record<string, string> = {};
    for (const e of this.problem.errors ?? []) out[e.path] ??= e.message;
    return out;
  }
}

export interface HttpClientOptions {
  /** Prefix for every path, e.g. "" in the browser (same origin) or "http://127.0.0.1:4000" in tests. */
  baseUrl: string;
  fetch?: typeof fetch;
  getAccessToken?: () => string | null | undefined;
  /** Called once on a 401; return true when a new token is available and the request should be retried. */
  refresh?: () => Promise<boolean>;
}

export interface RequestOptions<S extends z.ZodType> {
  query?: Record<string, string | number | boolean | undefined | null>;
  body?: unknown;
  schema: S;
  signal?: AbortSignal;
}

export interface HttpClient {
  request<S extends z.ZodType>(method: string, path: string, options: RequestOptions<S>): Promise<z.infer<S>>;
}

function networkProblem(detail: string): ProblemDetails {
  return { type: 'about:blank', title: 'The server could not be reached', status: 503, code: 'NETWORK_ERROR', detail };
}

async function toApiError(res: Response): Promise<ApiError> {
  const text = await res.text().catch(() => '');
  try {
    const parsed = ProblemDetailsSchema.safeParse(JSON.parse(text));
    if (parsed.success) return new ApiError(parsed.data);
  } catch {
    /* not JSON: fall through to a generic problem */
  }
  return new ApiError({
    type: 'about:blank',
    title: res.statusText || 'Request failed',
    status: res.status >= 400 ? res.status : 500,
    code: 'UNEXPECTED_RESPONSE',
  });
}

export function createHttpClient(options: HttpClientOptions): HttpClient {
  const doFetch = options.fetch ?? globalThis.fetch.bind(globalThis);

  async function send(method: string, path: string, o: RequestOptions<z.ZodType>): Promise<Response> {
    const url = new URL(options.baseUrl + path, 'http://relative.invalid');
    for (const [k, v] of Object.entries(o.query ?? {})) if (v !== undefined && v !== null && v !== '') url.searchParams.set(k, String(v));
    const href = options.baseUrl.startsWith('http') ? url.href : url.pathname + url.search;
    const headers: Record<string, string> = { accept: 'application/json' };
    const token = options.getAccessToken?.();
    if (token) headers.authorization = `Bearer ${token}`;
    if (o.body !== undefined) headers['content-type'] = 'application/json';
    try {
      return await doFetch(href, {
        method,
        headers,
        body: o.body === undefined ? undefined : JSON.stringify(o.body),
        credentials: 'same-origin',
        signal: o.signal,
      });
    } catch (err) {
      if ((err as Error).name === 'AbortError') throw err;
      throw new ApiError(networkProblem((err as Error).message));
    }
  }

  return {
    async request(method, path, o) {
      let res = await send(method, path, o);
      if (res.status === 401 && options.refresh && (await options.refresh())) res = await send(method, path, o);
      if (!res.ok) throw await toApiError(res);
      const json: unknown = res.status === 204 ? {} : await res.json();
      const parsed = o.schema.safeParse(json);
      if (!parsed.success) {
        throw new ApiError({
          type: 'about:blank',
          title: 'The server sent an answer this app does not understand',
          status: 502,
          code: 'UNEXPECTED_RESPONSE',
          detail: parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '),
        });
      }
      return parsed.data;
    },
  };
}
