/**
 * The API's JSON body parser, with two checks made on the raw bytes while they are in hand (one pass,
 * about a millisecond per megabyte): how deeply the value nests, and whether any string holds the NUL
 * character. PostgreSQL text cannot store U+0000, and code that walks a value recursively (merging,
 * comparing, copying) overflows its stack on a value nested 200,000 deep; both used to answer 500.
 * Only when the scan saw an escaped NUL is the parsed body walked to name the fields that hold one.
 */
import express, { type RequestHandler } from 'express';
import { badRequest, validationFailed } from '../errors';

/** Deepest nesting a request body may have. A survey change nests about a dozen levels. */
export const MAX_JSON_DEPTH = 64;

interface Scan {
  tooDeep: boolean;
  hasNul: boolean;
}
const scans = new WeakMap<object, Scan>();

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const OPEN_BRACE = 0x7b;
const OPEN_BRACKET = 0x5b;
const CLOSE_BRACE = 0x7d;
const CLOSE_BRACKET = 0x5d;
const U = 0x75;
const ZERO = 0x30;

/** Nesting depth and escaped NULs of JSON text (JSON allows U+0000 in a string only as an escape). */
export function scanJson(buf: Uint8Array): Scan {
  let depth = 0;
  let inString = false;
  let hasNul = false;
  for (let i = 0; i < buf.length; i++) {
    const b = buf[i];
    if (inString) {
      if (b === BACKSLASH) {
        if (buf[i + 1] === U && buf[i + 2] === ZERO && buf[i + 3] === ZERO && buf[i + 4] === ZERO && buf[i + 5] === ZERO) hasNul = true;
        i++;
      } else if (b === QUOTE) inString = false;
    } else if (b === QUOTE) inString = true;
    else if (b === OPEN_BRACE || b === OPEN_BRACKET) {
      if (++depth > MAX_JSON_DEPTH) return { tooDeep: true, hasNul };
    } else if (b === CLOSE_BRACE || b === CLOSE_BRACKET) depth--;
  }
  return { tooDeep: false, hasNul };
}

/** Paths (as `a.b.0`) of the strings in `value` that hold U+0000; `value` nests at most MAX_JSON_DEPTH. */
function nulPaths(value: unknown, path: (string | number)[] = [], out: string[] = []): string[] {
  if (out.length >= 20) return out;
  if (typeof value === 'string') {
    if (value.includes('\u0000')) out.push(path.join('.'));
  } else if (Array.isArray(value)) value.forEach((v, i) => nulPaths(v, [...path, i], out));
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) nulPaths(v, [...path, k], out);
  return out;
}

export function jsonBody(opts: { limit: string }): RequestHandler[] {
  const parse = express.json({
    limit: opts.limit,
    verify: (req, _res, buf) => {
      scans.set(req, scanJson(buf));
    },
  });
  const check: RequestHandler = (req, _res, next) => {
    const scan = scans.get(req);
    if (!scan) return next();
    if (scan.tooDeep) {
      return next(badRequest(`The request body nests more than ${MAX_JSON_DEPTH} levels deep.`));
    }
    if (scan.hasNul) {
      const paths = nulPaths(req.body);
      if (paths.length) {
        const message = 'must not contain the NUL character (U+0000)';
        return next(
          validationFailed(`Some fields hold the NUL character (U+0000): ${paths.join(', ')}.`, paths.map((p) => ({ path: p, message }))),
        );
      }
    }
    next();
  };
  return [parse, check];
}
