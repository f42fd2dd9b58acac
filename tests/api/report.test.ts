/** The calculation report: server-rendered HTML for the firm's members, every boundary with its inputs and results. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/app';
import { authHeader, createOrgWithMembers, signIn, type TestOrg } from '../support/auth';
import { storeSurvey } from '../support/surveys';
import { escapeHtml } from '../../server/brief/html';

let t: TestApp;
let org: TestOrg;

beforeAll(async () => {
  t = await startTestApp();
  org = await createOrgWithMembers(t.db);
});
afterAll(async () => t?.close());

describe('GET /api/surveys/:id/report', () => {
  it('renders every boundary, the readings, the methods with sources and a signature block', async () => {
    const s = await storeSurvey(t.db, org.surveyor);
    const { accessToken } = await signIn(t.url, org.engineer.email);
    const res = await fetch(`${t.url}/api/surveys/${s.id}/report`, { headers: authHeader(accessToken) });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('text/html');
    const text = await res.text();
    for (const b of s.boundaries) expect(text).toContain(`data-boundary="${escapeHtml(b.name)}"`);
    expect(s.boundaries.length).toBeGreaterThan(3);
    expect(text).toContain('Methods and sources');
    expect(text).toContain('SOLAS Chapter II-1, Regulation 7-3');
    // a default permeability names its standard and basis in plain words; "from memory" is a note
    // for the tests and comments, never for the signed report
    // (the demo's spaces all take the default)
    expect(s.compartments.some((c) => c.permeability === undefined)).toBe(true);
    expect(text).toMatch(/Regulation 7-3: standard value for a [a-z -]+space/);
    expect(text).not.toMatch(/from memory/i);
    expect(text).toContain('Engine version');
    expect(text).toContain('Signature and date');
    expect(text).not.toContain('<script');
  });

  it('answers 404 with a readable body for a malformed id', async () => {
    const { accessToken } = await signIn(t.url, org.surveyor.email);
    const res = await fetch(`${t.url}/api/surveys/not-a-uuid/report`, { headers: authHeader(accessToken) });
    expect(res.status).toBe(404);
    expect((await res.json()).error.message).toContain('No such survey');
  });
});
