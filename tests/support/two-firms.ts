/**
 * The usual start of an API test file: the app, a firm with one member per role, a second firm,
 * and access tokens for them (made directly, without the sign-in route's rate limits).
 */
import type { SurveyChange } from '@shared/schemas/sync';
import { startTestApp, type TestApp } from './app';
import { createOrgWithMembers, type TestOrg } from './auth';
import { tokenFor } from './surveys';

export interface TwoFirms {
  t: TestApp;
  org: TestOrg;
  other: TestOrg;
  tok: { admin: string; engineer: string; surveyor: string; otherAdmin: string; otherEngineer: string };
}

export async function startWithTwoFirms(): Promise<TwoFirms> {
  const t = await startTestApp();
  const org = await createOrgWithMembers(t.db);
  const other = await createOrgWithMembers(t.db);
  const secret = t.config.JWT_SECRET;
  const tok = {
    admin: await tokenFor(secret, org.members.admin),
    engineer: await tokenFor(secret, org.members.engineer),
    surveyor: await tokenFor(secret, org.members.surveyor),
    otherAdmin: await tokenFor(secret, other.admin),
    otherEngineer: await tokenFor(secret, other.engineer),
  };
  return { t, org, other, tok };
}

/** A push of `changes` to the started app with `token`, answered as is (status and body unread). */
export function pushAs(f: TwoFirms, token: string, changes: SurveyChange[]): Promise<Response> {
  return fetch(`${f.t.url}/api/sync/push`, { method: 'POST', headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, body: JSON.stringify({ changes }) });
}

/** The stored title of a survey, read straight from PostgreSQL. */
export async function storedTitle(f: TwoFirms, id: string): Promise<string> {
  return ((await f.t.db('surveys').where({ id }).first('doc')) as { doc: { title: string } }).doc.title;
}
