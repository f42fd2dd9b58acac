/**
 * The one way the client talks to the API. It attaches the access token kept in memory (never in
 * localStorage), refreshes it once on 401 through the httpOnly refresh cookie, and turns error
 * bodies into `ApiError`s with the server's message and field details.
 */
import type { ErrorBody } from '@shared/api/errors';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
    readonly requestId?: string,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

/** Thrown when there is no network at all (as opposed to an answer from the server). */
export class OfflineError extends Error {
  constructor() {
    super('No connection. Your work is kept on this device and will sync later.');
    this.name = 'OfflineError';
  }
}

type TokenSource = {
  get: () => string | null;
  /** Tries to get a fresh access token; resolves null when the user must sign in again. */
  refresh: () => Promise<string | null>;
};

let tokens: TokenSource = { get: () => null, refresh: async () => null };

export function setTokenSource(source: TokenSource): void {
  tokens = source;
}

/** The current access token, for requests fetch cannot make (upload progress through XMLHttpRequest). */
export const currentAccessToken = (): string | null => tokens.get();
export const refreshAccessToken = (): Promise<string | null> => tokens.refresh();

async function send(path: string, init: RequestInit, token: string | null): Promise<Response> {
  const headers = new Headers(init.headers);
  if (token) headers.set('Authorization', `Bearer ${token}`);
  if (init.body && !(init.body instanceof FormData) && !headers.has('Content-Type')) {
    headers.set('Content-Type', 'application/json');
  }
  try {
    return await fetch(path, { ...init, headers, credentials: 'same-origin' });
  } catch {
    throw new OfflineError();
  }
}

/**
 * The error body, when `value` has the shape of `ErrorBodySchema` (shared/api/errors.ts). Checked by
 * hand: every screen loads this module, and zod would add ~25 KB to the first screen's JavaScript.
 */
function asErrorBody(value: unknown): ErrorBody | undefined {
  const e = (value as { error?: unknown } | null)?.error as Record<string, unknown> | null | undefined;
  if (typeof e !== 'object' || e === null || Array.isArray(e)) return undefined;
  if (typeof e.code !== 'string' || typeof e.message !== 'string' || typeof e.requestId !== 'string') return undefined;
  return { error: { code: e.code, message: e.message, details: e.details, requestId: e.requestId } };
}

async function toError(res: Response): Promise<ApiError> {
  let body: ErrorBody | undefined;
  try {
    body = asErrorBody(await res.json());
  } catch {
    /* not JSON: fall through to a generic message */
  }
  return new ApiError(
    res.status,
    body?.error.code ?? 'http_error',
    body?.error.message ?? `The server answered ${res.status}.`,
    body?.error.details,
    body?.error.requestId,
  );
}

export async function apiFetch(path: string, init: RequestInit = {}): Promise<Response> {
  let res = await send(path, init, tokens.get());
  if (res.status === 401 && !path.startsWith('/api/auth/')) {
    const fresh = await tokens.refresh();
    if (fresh) res = await send(path, init, fresh);
  }
  if (!res.ok) throw await toError(res);
  return res;
}

export async function api<T>(path: string, init: RequestInit = {}): Promise<T> {
  const res = await apiFetch(path, init);
  if (res.status === 204) return undefined as T;
  return (await res.json()) as T;
}

export const jsonBody = (value: unknown): RequestInit => ({ body: JSON.stringify(value) });
