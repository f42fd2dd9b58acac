/**
 * Helmet's security headers, worked out once. With our options every header helmet sets is the same
 * for every response (no nonces, nothing read from the request), so helmet runs once at start-up
 * against a stand-in response and each request gets the recorded headers in one call, instead of
 * passing through helmet's dozen middleware functions. Should helmet ever do anything else to the
 * stand-in, the recording is abandoned and helmet runs on every request as usual.
 */
import type { IncomingMessage } from 'node:http';
import type { RequestHandler } from 'express';
import helmet, { type HelmetOptions } from 'helmet';

/** Our helmet options: helmet's defaults, with images, workers and WebAssembly the app needs. */
export const HELMET_OPTIONS: HelmetOptions = {
  contentSecurityPolicy: {
    directives: {
      'img-src': ["'self'", 'data:', 'blob:'],
      'worker-src': ["'self'", 'blob:'],
      'script-src': ["'self'", "'wasm-unsafe-eval'"],
    },
  },
};

export function securityHeaders(options: HelmetOptions = HELMET_OPTIONS): RequestHandler {
  const perRequest = helmet(options);
  const headers = new Map<string, string | number | readonly string[]>();
  const removed: string[] = [];
  let finished = false;
  const standIn = {
    setHeader: (name: string, value: string | number | readonly string[]) => void headers.set(name, value),
    removeHeader: (name: string) => void removed.push(name),
  };
  try {
    perRequest({ headers: {}, method: 'GET', url: '/' } as IncomingMessage, standIn as never, () => {
      finished = true;
    });
  } catch {
    finished = false;
  }
  if (!finished || headers.size === 0) return perRequest as unknown as RequestHandler;
  return (_req, res, next) => {
    for (const name of removed) res.removeHeader(name);
    res.setHeaders(headers as Map<string, string | number | readonly string[]>);
    next();
  };
}
