/**
 * The one way the client talks to the Paraxia server. It sends the session
 * cookie, adds the CSRF double-submit header to every state-changing request,
 * and turns any failure into an ApiError whose `message` is a sentence a
 * person can act on (the server's own message when it sent one).
 */
import type { ServerErrorBody } from '@/types/api';

export const CSRF_COOKIE_NAME = 'paraxia_csrf';
export const CSRF_HEADER_NAME = 'x-csrf-token';
/** GET endpoint that sets the CSRF cookie as a side effect, answering 200 or 401. */
const CSRF_PRIMING_PATH = '/api/auth/me';

export class ApiError extends Error {
  /** HTTP status; 0 when the server could not be reached at all. */
  readonly status: number;
  /** Per-field sentences from a 400 answer, keyed by the request's field names. */
  readonly fields: Record<string, string>;
  /** From a Retry-After header (429, 503), in seconds; null when absent. */
  readonly retryAfterSeconds: number | null;
  /** The parsed body, for callers that must read a non-error shape sent with an error status. */
  readonly body: unknown;

  constructor(args: {
    status: number;
    message: string;
    fields?: Record<string, string>;
    retryAfterSeconds?: number | null;
    body?: unknown;
  }) {
    super(args.message);
    this.name = 'ApiError';
    this.status = args.status;
    this.fields = args.fields ?? {};
    this.retryAfterSeconds = args.retryAfterSeconds ?? null;
    this.body = args.body;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

export function isUnauthorisedError(error: unknown): boolean {
  return isApiError(error) && error.status === 401;
}

function isServerErrorBody(body: unknown): body is ServerErrorBody {
  if (typeof body !== 'object' || body === null || !('error' in body)) return false;
  const error = (body as { error: unknown }).error;
  return typeof error === 'object' && error !== null && typeof (error as { message?: unknown }).message === 'string';
}

/** Reads one cookie's value from a `document.cookie`-style string. */
export function readCookie(cookieString: string, name: string): string | null {
  for (const part of cookieString.split(';')) {
    const separator = part.indexOf('=');
    if (separator < 0) continue;
    if (part.slice(0, separator).trim() === name) {
      return decodeURIComponent(part.slice(separator + 1).trim());
    }
  }
  return null;
}

/** Retry-After is either delta-seconds or an HTTP date (RFC 9110 §10.2.3). */
export function parseRetryAfterSeconds(header: string | null, nowMs: number): number | null {
  if (header === null || header.trim() === '') return null;
  const seconds = Number(header);
  if (Number.isFinite(seconds)) return Math.max(0, Math.ceil(seconds));
  const dateMs = Date.parse(header);
  if (Number.isNaN(dateMs)) return null;
  return Math.max(0, Math.ceil((dateMs - nowMs) / 1000));
}

export function describeWait(seconds: number): string {
  if (seconds < 60) return seconds <= 1 ? 'a second' : `${seconds} seconds`;
  const minutes = Math.ceil(seconds / 60);
  return minutes === 1 ? 'a minute' : `${minutes} minutes`;
}

function fallbackMessage(status: number, retryAfterSeconds: number | null): string {
  switch (status) {
    case 400:
      return 'The server could not accept this request. Check the fields and try again.';
    case 401:
      return 'You are not signed in, or your session has ended. Sign in again.';
    case 403:
      return 'Your roles do not allow this action.';
    case 404:
      return 'The server has no record at this address.';
    case 409:
      return 'Someone changed this record at the same time. Reload it and try again.';
    case 413:
      return 'The upload is larger than the server accepts.';
    case 429:
      return retryAfterSeconds === null
        ? 'Too many attempts in a short time. Wait a few minutes and try again.'
        : `Too many attempts in a short time. Wait ${describeWait(retryAfterSeconds)} and try again.`;
    default:
      return status >= 500
        ? `The Paraxia server could not answer (HTTP ${status}). Try again in a moment; if it keeps happening, tell your administrator.`
        : `The Paraxia server refused the request (HTTP ${status}).`;
  }
}

/** A response body as text, parsed as JSON when the server says it is JSON. */
export function parseAnswerText(status: number, text: string, contentType: string): unknown {
  if (status === 204 || status === 205 || text === '') return undefined;
  if (contentType.includes('json')) {
    try {
      return JSON.parse(text);
    } catch {
      return text;
    }
  }
  return text;
}

async function readBody(response: Response): Promise<unknown> {
  if (response.status === 204 || response.status === 205) return undefined;
  return parseAnswerText(response.status, await response.text(), response.headers.get('content-type') ?? '');
}

export interface FailedAnswer {
  status: number;
  /** The parsed body (see parseAnswerText). */
  body: unknown;
  retryAfterHeader: string | null;
  nowMs: number;
}

/** The ApiError for a non-2xx answer: the server's own sentence when it sent one. Shared by fetch and upload requests. */
export function apiErrorFromAnswer({ status, body, retryAfterHeader, nowMs }: FailedAnswer): ApiError {
  const retryAfterSeconds = parseRetryAfterSeconds(retryAfterHeader, nowMs);
  if (isServerErrorBody(body)) {
    return new ApiError({ status, message: body.error.message, fields: body.error.fields, retryAfterSeconds, body });
  }
  return new ApiError({ status, message: fallbackMessage(status, retryAfterSeconds), retryAfterSeconds, body });
}

export const UNREACHABLE_SERVER_MESSAGE = 'Could not reach the Paraxia server. Check the network connection and try again.';

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export interface RequestOptions {
  body?: unknown;
  signal?: AbortSignal;
}

export interface ApiClientOptions {
  /** Defaults to the global fetch. */
  fetch?: typeof fetch;
  /** Returns the current cookie string; defaults to `document.cookie`. */
  readCookies?: () => string;
  /** Clock for Retry-After dates; defaults to Date.now. */
  nowMs?: () => number;
}

export interface ApiClient {
  get<T>(path: string, options?: Omit<RequestOptions, 'body'>): Promise<T>;
  post<T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>): Promise<T>;
  put<T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>): Promise<T>;
  patch<T>(path: string, body?: unknown, options?: Omit<RequestOptions, 'body'>): Promise<T>;
  delete<T>(path: string, options?: Omit<RequestOptions, 'body'>): Promise<T>;
  /** The CSRF token for a state-changing request made outside this client (e.g. an upload); primes it when missing. */
  csrfToken(): Promise<string | null>;
}

export function createApiClient(options: ApiClientOptions = {}): ApiClient {
  const doFetch = options.fetch ?? ((input, init) => globalThis.fetch(input, init));
  const readCookies = options.readCookies ?? (() => (typeof document === 'undefined' ? '' : document.cookie));
  const nowMs = options.nowMs ?? (() => Date.now());
  let csrfPriming: Promise<void> | null = null;

  async function csrfToken(): Promise<string | null> {
    const existing = readCookie(readCookies(), CSRF_COOKIE_NAME);
    if (existing) return existing;
    // Concurrent first writes share one priming request.
    csrfPriming ??= doFetch(CSRF_PRIMING_PATH, {
      method: 'GET',
      credentials: 'same-origin',
      headers: { accept: 'application/json' },
    })
      .then(() => undefined)
      .catch(() => undefined)
      .finally(() => {
        csrfPriming = null;
      });
    await csrfPriming;
    // Still absent: send without it and let the server's 403 message explain.
    return readCookie(readCookies(), CSRF_COOKIE_NAME);
  }

  async function request<T>(method: Method, path: string, requestOptions: RequestOptions = {}): Promise<T> {
    const headers: Record<string, string> = { accept: 'application/json' };
    let body: BodyInit | undefined;
    if (requestOptions.body !== undefined) {
      headers['content-type'] = 'application/json';
      body = JSON.stringify(requestOptions.body);
    }
    if (method !== 'GET') {
      const token = await csrfToken();
      if (token) headers[CSRF_HEADER_NAME] = token;
    }

    let response: Response;
    try {
      response = await doFetch(path, {
        method,
        headers,
        body,
        credentials: 'same-origin',
        signal: requestOptions.signal,
      });
    } catch (cause) {
      if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
      throw new ApiError({ status: 0, message: UNREACHABLE_SERVER_MESSAGE });
    }

    const parsed = await readBody(response);
    if (response.ok) return parsed as T;
    throw apiErrorFromAnswer({
      status: response.status,
      body: parsed,
      retryAfterHeader: response.headers.get('retry-after'),
      nowMs: nowMs(),
    });
  }

  return {
    get: (path, o) => request('GET', path, o),
    post: (path, body, o) => request('POST', path, { ...o, body }),
    put: (path, body, o) => request('PUT', path, { ...o, body }),
    patch: (path, body, o) => request('PATCH', path, { ...o, body }),
    delete: (path, o) => request('DELETE', path, o),
    csrfToken,
  };
}

export const api = createApiClient();
