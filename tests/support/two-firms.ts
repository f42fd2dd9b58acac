/**
 * The usual start of an API test file: the app, a firm with one member per role, a second firm,
 * and access tokens for them (made directly, without the sign-in route's rate limits).
 */
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
