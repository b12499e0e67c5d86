import type {
  Request as ExpressRequest,
  RequestHandler,
  Response as ExpressResponse,
} from 'express';
import { HttpError, validationError } from '../errors';
import { findBodyTextIssues } from '../validation';

/** Largest body an auth endpoint accepts (an e-mail, a password, a token). */
const AUTH_BODY_LIMIT = 64 * 1024;

function readBody(req: ExpressRequest): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size <= AUTH_BODY_LIMIT) chunks.push(c);
    });
    req.on('end', () =>
      size > AUTH_BODY_LIMIT
        ? reject(
            new HttpError(
              413,
              'payload_too_large',
              'The request body is larger than the server accepts',
            ),
          )
        : resolve(Buffer.concat(chunks)),
    );
    req.on('error', reject);
  });
}

/** better-auth's error codes (`INVALID_EMAIL_OR_PASSWORD` …) mapped to ours by status. */
function codeForStatus(status: number): string {
  if (status === 400) return 'bad_request';
  if (status === 401) return 'unauthenticated';
  if (status === 403) return 'forbidden';
  if (status === 404) return 'not_found';
  if (status === 409) return 'conflict';
  if (status === 413) return 'payload_too_large';
  if (status === 422) return 'validation';
  if (status === 429) return 'rate_limited';
  return status >= 500 ? 'internal' : 'bad_request';
}

/**
 * The better-auth endpoints under /api/auth, with the same request gates as the rest of the API
 * (bounded body, storable text) and errors in the API's `{ error: { code, message, details } }`
 * shape. better-auth's own `{ code, message }` fields are kept beside `error` for its clients.
 */
export function authHandler(handle: (request: Request) => Promise<Response>): RequestHandler {
  return async (req, res, next) => {
    try {
      const hasBody = req.method !== 'GET' && req.method !== 'HEAD';
      const body = hasBody ? await readBody(req) : undefined;
      if (body && body.length > 0 && (req.headers['content-type'] ?? '').includes('json')) {
        let parsed: unknown;
        try {
          parsed = JSON.parse(body.toString('utf8'));
        } catch {
          throw new HttpError(400, 'bad_request', 'The request body is not valid JSON', [
            { path: 'body', message: 'is not valid JSON' },
          ]);
        }
        const issues = findBodyTextIssues(parsed);
        if (issues.length > 0) throw validationError(issues);
      }
      const headers = new Headers();
      for (const [k, v] of Object.entries(req.headers)) {
        if (v === undefined) continue;
        if (Array.isArray(v)) for (const x of v) headers.append(k, x);
        else headers.set(k, v);
      }
      const url = new URL(req.originalUrl, `http://${req.headers.host ?? '127.0.0.1'}`);
      const answer = await handle(
        new Request(url, {
          method: req.method,
          headers,
          body: body && body.length > 0 ? new Uint8Array(body) : undefined,
        }),
      );
      await sendAnswer(res, answer);
    } catch (err) {
      next(err);
    }
  };
}

async function sendAnswer(res: ExpressResponse, answer: Response) {
  res.status(answer.status);
  const cookies = answer.headers.getSetCookie();
  answer.headers.forEach((value, key) => {
    if (key === 'set-cookie' || key === 'content-length') return;
    res.setHeader(key, value);
  });
  if (cookies.length > 0) res.setHeader('set-cookie', cookies);
  const raw = Buffer.from(await answer.arrayBuffer());
  if (answer.status < 400) {
    res.end(raw);
    return;
  }
  let data: Record<string, unknown> = {};
  try {
    const parsed: unknown = raw.length > 0 ? JSON.parse(raw.toString('utf8')) : {};
    if (parsed && typeof parsed === 'object' && !Array.isArray(parsed))
      data = parsed as Record<string, unknown>;
  } catch {
    data = raw.length > 0 ? { message: raw.toString('utf8').slice(0, 300) } : {};
  }
  // An answer already in the API's shape (e.g. the sign-in limits' 429) is passed on as it is.
  const own = data.error as { code?: unknown } | undefined;
  if (own && typeof own === 'object' && typeof own.code === 'string') {
    res.setHeader('content-type', 'application/json; charset=utf-8');
    res.end(raw);
    return;
  }
  const message =
    typeof data.message === 'string' && data.message !== ''
      ? data.message
      : `The sign-in service refused the request (${answer.status})`;
  const details =
    typeof data.code === 'string'
      ? [{ path: 'body', message: data.code }]
      : [{ path: 'body', message }];
  res.setHeader('content-type', 'application/json; charset=utf-8');
  res.end(
    JSON.stringify({
      ...data,
      message,
      error: { code: codeForStatus(answer.status), message, details },
    }),
  );
}
