/**
 * A write whose database connection breaks after PostgreSQL carried it out (a COMMIT sent, its answer
 * lost; or SQLSTATE 08007, transaction resolution unknown) may well have been stored, so the 503 must
 * not say "Nothing was changed". It says the change may or may not have been stored; the device keeps
 * the edit, sends it again, and the idempotency key makes the second sending a duplicate, not a second edit.
 * (Before, a connection lost during COMMIT answered 500: knex puts the statement before node-postgres's
 * "Connection terminated unexpectedly", and the outage test looked for that text at the start.)
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@shared/api/errors';
import { PushResponseSchema } from '@shared/schemas/sync';
import type { TestApp } from '../support/app';
import { authHeader, type TestOrg } from '../support/auth';
import { change, newSurvey, tokenFor } from '../support/surveys';
import { startAppThroughProxy, type PgProxy } from '../support/pg-proxy';
import type { Db } from '../../server/db/knex';
import { isDatabaseUnavailable, outageOutcomeUnknown } from '../../server/middleware/errors';

let t: TestApp;
let direct: Db;
let org: TestOrg;
let proxy: PgProxy;
let close: () => Promise<void>;

beforeAll(async () => {
  ({ t, direct, org, proxy, close } = await startAppThroughProxy());
});
afterAll(async () => {
  await close?.();
});

describe('a write whose outcome is unknown', () => {
  it('answers 503 saying the change may have been stored; the re-sent change is a duplicate, stored once', async () => {
    const token = await tokenFor(t.config.JWT_SECRET, org.surveyor);
    const survey = newSurvey();
    // A new survey is written in a transaction (the locked run), so the push ends with a COMMIT.
    const body = JSON.stringify({ changes: [change(randomUUID(), survey.id, { kind: 'create', survey })] });
    const send = () => fetch(`${t.url}/api/sync/push`, { method: 'POST', headers: { ...authHeader(token), 'content-type': 'application/json' }, body });

    const broken = proxy.breakAfterSending('COMMIT');
    const res = await send();
    await broken;
    expect(res.status).toBe(503);
    const error = ErrorBodySchema.parse(await res.json()).error;
    expect(error.code).toBe('db_unavailable');
    expect(error.message).toMatch(/may or may not have been stored/);
    expect(error.message).not.toMatch(/Nothing was changed/);
    expect(error.details).toEqual({ outcome: 'unknown' });
    // And it had been stored: "Nothing was changed" would have been untrue.
    expect(await direct('surveys').where({ id: survey.id }).pluck('revision')).toEqual([1]);

    // The device sends the same change again: answered as already done, nothing stored twice.
    const again = await send();
    expect(again.status).toBe(200);
    expect(PushResponseSchema.parse(await again.json()).results.map((r) => r.status)).toEqual(['duplicate']);
    expect(await direct('surveys').where({ id: survey.id }).pluck('revision')).toEqual([1]);
    expect(await direct('survey_revisions').where({ survey_id: survey.id })).toHaveLength(1);
  });

  it('a read that meets an outage still says nothing was changed', async () => {
    const token = await tokenFor(t.config.JWT_SECRET, org.surveyor);
    proxy.cut();
    try {
      const res = await fetch(`${t.url}/api/surveys`, { headers: authHeader(token) });
      expect(res.status).toBe(503);
      expect(ErrorBodySchema.parse(await res.json()).error.message).toMatch(/Nothing was changed/);
    } finally {
      proxy.restore();
    }
  });

  it('sorts outage errors by whether a write may have gone through', () => {
    const err = (code: string, message = 'lost') => Object.assign(new Error(message), { code });
    // PostgreSQL Appendix A, class 08: 08007 transaction_resolution_unknown, 08006 connection_failure,
    // 08003 connection_does_not_exist; 57P01 admin_shutdown ends sessions mid-statement.
    for (const code of ['08007', '08006', '08003', 'ECONNRESET', 'EPIPE', '57P01']) {
      expect([code, outageOutcomeUnknown(err(code), 'POST')]).toEqual([code, true]);
      expect([code, outageOutcomeUnknown(err(code), 'GET')]).toEqual([code, false]);
    }
    expect(outageOutcomeUnknown(new Error('Connection terminated unexpectedly'), 'PUT')).toBe(true);
    // knex puts the statement before node-postgres's message.
    expect(outageOutcomeUnknown(new Error('COMMIT; - Connection terminated unexpectedly'), 'POST')).toBe(true);
    expect(isDatabaseUnavailable(new Error('COMMIT; - Connection terminated unexpectedly'))).toBe(true);
    // No connection was made: nothing was sent. 08001 sqlclient_unable_to_establish_sqlconnection,
    // 08004 sqlserver_rejected_establishment_of_sqlconnection, 57P03 cannot_connect_now, 53300 too_many_connections.
    for (const code of ['08001', '08004', '57P03', '53300', 'ECONNREFUSED', 'ENOTFOUND']) {
      expect([code, outageOutcomeUnknown(err(code), 'POST')]).toEqual([code, false]);
    }
  });
});
