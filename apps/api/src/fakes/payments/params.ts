// Errors in the payments provider's shape, and readers for its form-encoded parameters
// (qs-parsed: nested objects for `a[b]=…`, arrays for `a[0]=…`, every value a string).

export interface ProviderErrorBody {
  type: 'api_error' | 'card_error' | 'idempotency_error' | 'invalid_request_error';
  code?: string;
  decline_code?: string;
  message: string;
  param?: string;
  [extra: string]: unknown;
}

/** An error the fake answers with `{ error }` and the matching HTTP status. */
export class ProviderError extends Error {
  constructor(
    readonly status: number,
    readonly body: ProviderErrorBody,
    /** Bad parameters: the provider keeps no idempotent result for these. */
    readonly validation = false,
  ) {
    super(body.message);
    this.name = 'ProviderError';
  }
}

export const invalid = (message: string, param?: string, code = 'parameter_invalid') =>
  new ProviderError(400, { type: 'invalid_request_error', code, message, ...(param ? { param } : {}) }, true);

export const missingObject = (kind: string, id: string, param = 'id') =>
  new ProviderError(404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such ${kind}: '${id}'`, param });

export const unexpectedState = (message: string, code = 'payment_intent_unexpected_state') =>
  new ProviderError(400, { type: 'invalid_request_error', code, message });

export type Params = Record<string, unknown>;

export function asParams(value: unknown, param: string): Params {
  if (value === undefined || value === '') return {};
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw invalid(`Invalid object for ${param}.`, param);
  return value as Params;
}

/** Refuses parameters the endpoint does not know, as the provider does. */
export function allow(params: Params, known: readonly string[], prefix = ''): void {
  for (const key of Object.keys(params)) {
    if (!known.includes(key)) {
      const name = prefix ? `${prefix}[${key}]` : key;
      throw invalid(`Received unknown parameter: ${name}`, name, 'parameter_unknown');
    }
  }
}

function readString(params: Params, name: string, required: boolean, param: string, max?: number): string | undefined {
  const value = params[name];
  if (value === undefined || value === '') {
    if (required) throw invalid(`Missing required param: ${param}.`, param, 'parameter_missing');
    return undefined;
  }
  if (typeof value !== 'string') throw invalid(`Invalid string: ${param}.`, param);
  if (max !== undefined && value.length > max) throw invalid(`${param} must be at most ${max} characters.`, param);
  return value;
}

export function str(params: Params, name: string, o: { required: true; max?: number; param?: string }): string;
export function str(params: Params, name: string, o?: { required?: false; max?: number; param?: string }): string | undefined;
export function str(params: Params, name: string, o: { required?: boolean; max?: number; param?: string } = {}): string | undefined {
  return readString(params, name, o.required ?? false, o.param ?? name, o.max);
}

export function int(params: Params, name: string, o: { required: true; min?: number; param?: string }): number;
export function int(params: Params, name: string, o?: { required?: false; min?: number; param?: string }): number | undefined;
export function int(params: Params, name: string, o: { required?: boolean; min?: number; param?: string } = {}): number | undefined {
  const param = o.param ?? name;
  const raw = readString(params, name, o.required ?? false, param);
  if (raw === undefined) return undefined;
  if (!/^-?\d+$/.test(raw)) throw invalid(`Invalid integer: ${raw}`, param, 'parameter_invalid_integer');
  const value = Number(raw);
  if (!Number.isSafeInteger(value)) throw invalid(`Invalid integer: ${raw}`, param, 'parameter_invalid_integer');
  if (o.min !== undefined && value < o.min) throw invalid(`This value must be greater than or equal to ${o.min}.`, param);
  return value;
}

export function oneOf<T extends string>(params: Params, name: string, values: readonly T[], fallback: T, param = name): T {
  const raw = str(params, name, { param });
  if (raw === undefined) return fallback;
  if (!(values as readonly string[]).includes(raw)) throw invalid(`Invalid ${param}: must be one of ${values.join(', ')}`, param);
  return raw as T;
}

export function currency(params: Params, name: string, param = name): string {
  const raw = str(params, name, { required: true, param }).toLowerCase();
  if (!/^[a-z]{3}$/.test(raw)) throw invalid(`Invalid currency: ${raw}.`, param);
  return raw;
}

/** Metadata as the provider limits it: up to 50 keys of 40 characters, values of 500; "" unsets. */
export function metadata(value: unknown, param = 'metadata'): Record<string, string> {
  const raw = asParams(value, param);
  const out: Record<string, string> = {};
  const entries = Object.entries(raw);
  if (entries.length > 50) throw invalid('You can specify up to 50 metadata keys.', param);
  for (const [key, v] of entries) {
    if (key.length > 40) throw invalid(`Metadata keys can be up to 40 characters long: ${key}`, `${param}[${key}]`);
    if (typeof v !== 'string') throw invalid(`Invalid metadata value for ${key}: must be a string.`, `${param}[${key}]`);
    if (v.length > 500) throw invalid(`Metadata values can be up to 500 characters long: ${key}`, `${param}[${key}]`);
    if (v !== '') out[key] = v;
  }
  return out;
}

export function url(params: Params, name: string, o: { required: boolean }): string | undefined {
  const raw = readString(params, name, o.required, name);
  if (raw === undefined) return undefined;
  // the session-id placeholder is not URL syntax, so it is checked with a stand-in
  if (!URL.canParse(raw.replaceAll('{CHECKOUT_SESSION_ID}', 'x')) || !/^https?:\/\//i.test(raw)) throw invalid(`Not a valid URL: ${name}`, name, 'url_invalid');
  return raw;
}

/** `expand[]` as a list of dotted paths. */
export function expandList(params: Params): string[] {
  const raw = params.expand;
  if (raw === undefined || raw === '') return [];
  const list = Array.isArray(raw) ? raw : typeof raw === 'object' && raw !== null ? Object.values(raw) : [raw];
  return list.map(String);
}
