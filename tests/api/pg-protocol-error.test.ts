/**
 * PostgreSQL's protocol violation (SQLSTATE 08P01) is a query this server built wrongly, not an
 * outage: it answers 500 `internal` and is logged as an error, where it was dressed as 503
 * `db_unavailable` ("try again shortly", which would never help). The error is made for real: more
 * bind parameters than the protocol's 16-bit count holds (PostgreSQL frontend/backend protocol,
 * Bind message: "Int16 — the number of parameter values"). Losing the connection stays 503.
 */
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest';
import type { NextFunction, Request, Response } from 'express';
import { createDb, type Db } from '../../server/db/knex';
import { errorHandler, isDatabaseUnavailable } from '../../server/middleware/errors';

let db: Db;
beforeAll(() => {
  db = createDb(inject('testEnv').DATABASE_URL);
});
afterAll(async () => {
  await db?.destroy();
});

/** Runs the app's error middleware on `err`; returns the status, the body and what was logged at which level. */
function answer(err: unknown): { status: number; body: { error: { code: string } }; logged: string[] } {
  const logged: string[] = [];
  const res = { statusCode: 0, body: undefined as unknown, headersSent: false, headers: {} as Record<string, string> };
  const fakeRes = {
    get headersSent() {
      return res.headersSent;
    },
    setHeader: (k: string, v: string) => void (res.headers[k] = v),
    status(code: number) {
      res.statusCode = code;
      return this;
    },
    json(b: unknown) {
      res.body = b;
      return this;
    },
  } as unknown as Response;
  const log = { warn: () => logged.push('warn'), error: () => logged.push('error') };
  errorHandler(err, { id: 'r1', log } as unknown as Request, fakeRes, (() => undefined) as NextFunction);
  return { status: res.statusCode, body: res.body as { error: { code: string } }, logged };
}

describe('PostgreSQL protocol violation (08P01)', () => {
  it('PostgreSQL answers 08P01 to more than 65,535 bind parameters', async () => {
    const n = 70_000;
    const err = await db.raw(`SELECT 1 WHERE 1 IN (${Array(n).fill('?').join(',')})`, Array.from({ length: n }, (_, i) => i)).then(
      () => null,
      (e: unknown) => e,
    );
    expect((err as { code?: string } | null)?.code).toBe('08P01');
    expect(isDatabaseUnavailable(err)).toBe(false);
    const out = answer(err);
    expect(out.status).toBe(500);
    expect(out.body.error.code).toBe('internal');
    expect(out.logged).toEqual(['error']);
  });

  it('a lost connection (class 08 otherwise, a refused socket) is still the 503 of an outage', () => {
    for (const code of ['08006', '08001', '08003', 'ECONNREFUSED', '57P01']) {
      const out = answer(Object.assign(new Error('connection lost'), { code }));
      expect([code, out.status, out.body.error.code]).toEqual([code, 503, 'db_unavailable']);
    }
  });
});
