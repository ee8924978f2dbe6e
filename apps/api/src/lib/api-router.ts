// Declares an API route once: Express handler, zod validation and its OpenAPI entry together.
import express, { type Request, type Response, type NextFunction, type RequestHandler } from 'express';
import multer from 'multer';
import type { OpenAPIRegistry, RouteConfig } from '@asteasolutions/zod-to-openapi';

type RouteParameter = NonNullable<RouteConfig['request']>['query'];
type RequestBody = NonNullable<RouteConfig['request']>['body'];
import { z } from 'zod';
import { ProblemDetailsSchema, toFieldErrors, type FieldError } from '@emberline/domain';
import type { Role } from '@emberline/domain';
import { HttpError, PayloadTooLarge, UnsupportedMediaType, ValidationFailed } from './errors';
import { ANONYMOUS, type Actor } from './context';
import type { Guards } from '../middleware/auth';

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';
type AnyObject = z.ZodObject;

export interface RouteSpec<Q extends AnyObject, P extends AnyObject, B extends z.ZodType, R extends z.ZodType> {
  method: Method;
  /** Express-style path relative to the router's mount point, e.g. "/catalogue/service-types/:code". */
  path: string;
  summary: string;
  description?: string;
  tags: string[];
  query?: Q;
  params?: P;
  /** The JSON body, or the text fields of a `multipart` upload; a function builds it per request (e.g. for "today"). */
  body?: B | (() => B);
  /** A multipart/form-data upload of one file (kept in memory, at most `maxBytes`) plus the text fields in `body`. */
  multipart?: { fileField: string; maxBytes: number };
  /** Schema of the success body, `{ data, meta? }`; not used when the route `produces` a file. */
  response?: R;
  /** The route answers with a file of one of these content types (the handler streams it), not JSON. */
  produces?: readonly string[];
  status?: 200 | 201 | 202;
  /** Rate limiters and other middleware, run first. */
  before?: RequestHandler[];
  /** Needs a signed-in account (bearer access token). */
  auth?: boolean;
  /** Public, but a caller who sends a bearer token is signed in (the handler may show them more). */
  optionalAuth?: boolean;
  /** An /orgs/:orgId route: the caller must be a member (or a network admin); others get 404. */
  org?: boolean;
  /** The caller needs one of these roles (platform roles, or the role held in the organisation). */
  roles?: Role[];
  /** Problem statuses this route can answer besides 400 and 500. */
  problems?: number[];
}

export interface RouteInput<Q, P, B> {
  query: Q;
  params: P;
  body: B;
  req: Request;
  res: Response;
  actor: Actor;
  /** The uploaded file of a `multipart` route (validation guarantees it is there). */
  file: Express.Multer.File | undefined;
}


// a high surrogate not followed by a low one, or a low one not preceded by a high one
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;
const MAX_TEXT_ERRORS = 20;

/**
 * Field errors for every string (value or key) holding a lone UTF-16 surrogate. JSON can carry
 * one ("\ud800") but UTF-8 cannot: stored, it would be mangled or fail the database's JSON check.
 * Walks without recursion, so a deeply nested body cannot overflow the stack.
 */
export function malformedTextErrors(value: unknown, prefix?: string): FieldError[] {
  // each node links to its parent: copying paths would cost depth² on a deeply nested body
  type Node = { value: unknown; key?: string; parent?: Node };
  const pathOf = (node: Node | undefined): string => {
    const keys: string[] = [];
    for (let n = node; n?.key !== undefined; n = n.parent) keys.push(n.key);
    return [prefix, ...keys.reverse()].filter(Boolean).join('.');
  };
  const errors: FieldError[] = [];
  const stack: Node[] = [{ value }];
  while (stack.length && errors.length < MAX_TEXT_ERRORS) {
    const node = stack.pop()!;
    if (typeof node.value === 'string') {
      if (LONE_SURROGATE.test(node.value)) errors.push({ path: pathOf(node), message: 'This text contains an invalid character (a lone UTF-16 surrogate)' });
    } else if (node.value && typeof node.value === 'object') {
      for (const [key, child] of Object.entries(node.value)) {
        if (LONE_SURROGATE.test(key)) errors.push({ path: pathOf(node), message: 'A field name contains an invalid character (a lone UTF-16 surrogate)' });
        else stack.push({ value: child, key, parent: node });
      }
    }
  }
  return errors;
}

/** True when the request carries content (an empty body with Content-Length: 0 does not count). */
const hasContent = (req: Request) => req.headers['transfer-encoding'] !== undefined || Number(req.headers['content-length']) > 0;

/**
 * Refuses content of a type the route does not read (415): the JSON parser skips other types,
 * so JSON sent as text/plain would otherwise be treated as an empty body and succeed.
 */
function acceptOnly(type: 'application/json' | 'multipart/form-data'): RequestHandler {
  return (req, _res, next) => {
    if (!hasContent(req) || req.is(type)) return next();
    next(UnsupportedMediaType(`Send the request body as ${type}${req.headers['content-type'] ? `, not ${String(req.headers['content-type']).split(';')[0]}` : ''}.`));
  };
}

const problemContent = { 'application/problem+json': { schema: ProblemDetailsSchema } };
const problemDescriptions: Record<number, string> = {
  400: 'Bad input (problem details with field errors)',
  401: 'Not signed in',
  403: 'Not allowed',
  404: 'Not found',
  409: 'Conflict',
  413: 'The upload is too large',
  415: 'The body or file type is not accepted',
  422: 'The request is well formed but cannot be processed as it stands',
  429: 'Too many requests',
  500: 'Unexpected error',
  503: 'Temporarily unavailable',
};

const pascal = (words: string) => words.split(/[^A-Za-z0-9]+/).filter(Boolean).map((w) => w[0]!.toUpperCase() + w.slice(1)).join('');

/**
 * The operationId of a route, from its method and OpenAPI path below the mount point:
 * `get /api/orgs/{orgId}/bookings/{bookingId}` is `getOrgsByOrgIdBookingsByBookingId`. Made from
 * what identifies the operation anyway, so it stays the same while the route does (generated
 * clients name their functions by it), and it is unique when the camel-cased paths are.
 */
export function operationIdFor(method: Method, openApiPath: string, mountPath: string): string {
  const below = openApiPath.startsWith(mountPath) ? openApiPath.slice(mountPath.length) : openApiPath;
  const segments = below.split('/').filter(Boolean).map((segment) => {
    const param = /^\{(.+)\}$/.exec(segment);
    return param ? `By${pascal(param[1]!)}` : pascal(segment);
  });
  return method + segments.join('');
}

/** Runs multer for one file and turns its errors into problem details (413 for a file too large). */
function multipartUpload(spec: { fileField: string; maxBytes: number }): RequestHandler {
  const parse = multer({
    storage: multer.memoryStorage(),
    // browsers send file names as UTF-8 without saying so
    defParamCharset: 'utf8',
    limits: { fileSize: spec.maxBytes, files: 1, fields: 20, fieldSize: 4096, parts: 24 },
  }).single(spec.fileField);
  return (req, res, next) => {
    parse(req, res, (err?: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(PayloadTooLarge(`The file is larger than ${Math.round(spec.maxBytes / (1024 * 1024))} MB. Upload a smaller scan or photo.`));
        }
        const path = err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT' ? spec.fileField : (err.field ?? spec.fileField);
        return next(ValidationFailed('The upload could not be read.', [{ path, message: `${err.message}: send one file in the "${spec.fileField}" field` }]));
      }
      if (err instanceof HttpError) return next(err);
      next(new HttpError('BAD_REQUEST', 400, 'The request could not be understood', 'The multipart body could not be read.'));
    });
  };
}

/** The OpenAPI schema of a multipart body: the text fields plus the binary file. */
function multipartSchema(fields: z.ZodType | undefined, fileField: string) {
  const json = (fields ? z.toJSONSchema(fields, { io: 'input', unrepresentable: 'any' }) : {}) as { properties?: Record<string, unknown>; required?: string[] };
  return {
    type: 'object' as const,
    properties: { ...(json.properties ?? {}), [fileField]: { type: 'string' as const, format: 'binary' } },
    required: [...(json.required ?? []), fileField],
  };
}

export class ApiRouter {
  readonly router = express.Router();
  constructor(
    readonly registry: OpenAPIRegistry,
    /** Where the router is mounted, used for OpenAPI paths, e.g. "/api". */
    readonly mountPath: string,
    private readonly guards: Guards,
  ) {
    registry.registerComponent('securitySchemes', 'bearerAuth', { type: 'http', scheme: 'bearer', bearerFormat: 'JWT' });
  }

  private readonly operationIds = new Map<string, string>();

  /** The route's operationId (see operationIdFor); two routes that would share one fail at start-up. */
  operationId(method: Method, openApiPath: string): string {
    const id = operationIdFor(method, openApiPath, this.mountPath);
    const taken = this.operationIds.get(id);
    if (taken) throw new Error(`${method} ${openApiPath} and ${taken} would share the operationId ${id}`);
    this.operationIds.set(id, `${method} ${openApiPath}`);
    return id;
  }

  route<Q extends AnyObject, P extends AnyObject, B extends z.ZodType, R extends z.ZodType>(
    spec: RouteSpec<Q, P, B, R>,
    handler: (input: RouteInput<z.infer<Q>, z.infer<P>, z.infer<B>>) => Promise<z.infer<R>> | z.infer<R>,
  ): void {
    this.document(spec);
    const validateAndRun = async (req: Request, res: Response, next: NextFunction) => {
      const errors: FieldError[] = [];
      const take = <S extends z.ZodType>(schema: S | undefined, value: unknown, where: string): unknown => {
        if (!schema) return value;
        const result = schema.safeParse(value ?? {});
        if (!result.success) {
          errors.push(...toFieldErrors(result.error, where === 'body' ? undefined : where));
          return undefined;
        }
        return result.data;
      };
      // checked before the schemas, so no route can let such text through to the database
      const textErrors = [...malformedTextErrors(req.params, 'params'), ...malformedTextErrors(req.query, 'query'), ...malformedTextErrors(req.body)];
      if (textErrors.length) return next(ValidationFailed('Please correct the highlighted fields.', textErrors));
      const params = take(spec.params, req.params, 'params');
      const query = take(spec.query, req.query, 'query');
      const body = take(typeof spec.body === 'function' ? spec.body() : spec.body, req.body, 'body');
      if (spec.multipart && !req.file) errors.push({ path: spec.multipart.fileField, message: 'Choose a file to upload' });
      if (errors.length) return next(ValidationFailed('Please correct the highlighted fields.', errors));
      const actor = req.actor ?? ANONYMOUS;
      const data = await handler({ query, params, body, req, res, actor, file: req.file } as RouteInput<z.infer<Q>, z.infer<P>, z.infer<B>>);
      if (res.headersSent) return;
      // a handler may set its own status (e.g. 503 from health); otherwise use the declared one
      if (res.statusCode === 200 && spec.status) res.status(spec.status);
      res.json(data);
    };
    const needsAuth = spec.auth || spec.org || !!spec.roles;
    // guards first: nobody's upload is read before we know who they are and where they may write
    const chain: RequestHandler[] = [
      ...(spec.before ?? []),
      ...(needsAuth ? [this.guards.authenticate] : spec.optionalAuth ? [this.guards.optionalAuthenticate] : []),
      ...(spec.org ? [this.guards.orgScope] : []),
      ...(spec.roles ? [this.guards.requireRoles(spec.roles)] : []),
      acceptOnly(spec.multipart ? 'multipart/form-data' : 'application/json'),
      ...(spec.multipart ? [multipartUpload(spec.multipart)] : []),
    ];
    this.router[spec.method](spec.path, ...chain, validateAndRun);
  }

  private document(spec: RouteSpec<AnyObject, AnyObject, z.ZodType, z.ZodType>): void {
    const openApiPath = (this.mountPath + spec.path).replace(/:([A-Za-z0-9_]+)/g, '{$1}');
    const needsAuth = spec.auth || spec.org || !!spec.roles;
    const problems = new Set([400, 500, ...(needsAuth || spec.optionalAuth ? [401] : []), ...(spec.roles ? [403] : []), ...(spec.org ? [404] : []), ...(spec.before?.length ? [429] : []), ...(spec.multipart ? [413] : []), ...(spec.body || spec.multipart ? [415] : []), ...(spec.problems ?? [])]);
    if (!spec.response && !spec.produces) throw new Error(`${spec.method} ${spec.path} declares neither a response schema nor the files it produces`);
    const success = spec.produces
      ? Object.fromEntries(spec.produces.map((type) => [type, { schema: { type: 'string' as const, format: 'binary' } }]))
      : { 'application/json': { schema: spec.response! } };
    const responses: RouteConfig['responses'] = {
      [spec.status ?? 200]: { description: spec.produces ? 'The file' : 'Success', content: success },
    };
    const body = typeof spec.body === 'function' ? spec.body() : spec.body;
    const requestBody = spec.multipart
      ? ({ content: { 'multipart/form-data': { schema: multipartSchema(body, spec.multipart.fileField) } } } as RequestBody)
      : body
        ? { content: { 'application/json': { schema: body } } }
        : undefined;
    for (const status of [...problems].sort((a, b) => a - b)) {
      responses[status] = { description: problemDescriptions[status] ?? 'Problem', content: problemContent };
    }
    this.registry.registerPath({
      method: spec.method,
      path: openApiPath,
      operationId: this.operationId(spec.method, openApiPath),
      summary: spec.summary,
      description: spec.description,
      tags: spec.tags,
      // public operations say so: an empty list is "no security needed", a missing one "unspecified"
      security: needsAuth ? [{ bearerAuth: [] }] : spec.optionalAuth ? [{}, { bearerAuth: [] }] : [],
      request: {
        query: spec.query as RouteParameter,
        params: spec.params as RouteParameter,
        body: requestBody,
      },
      responses,
    });
  }
}
