/**
 * Helpers for tests that need people: a fresh organisation with one member per role, signing in,
 * and the Authorization header. Every call makes new rows with unique e-mail addresses, so test
 * files never share people.
 */
import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Knex } from 'knex';
import type { Role } from '@shared/api/roles';

export const TEST_PASSWORD = 'test-password-0123';

export interface TestMember {
  id: string;
  name: string;
  email: string;
  password: string;
  role: Role;
  orgId: string;
}

export interface TestOrg {
  id: string;
  name: string;
  admin: TestMember;
  engineer: TestMember;
  surveyor: TestMember;
  /** Every member, by role. */
  members: Record<Role, TestMember>;
}

// Cost 4 whatever the app's setting: these are test people, and bcrypt.compare reads the cost from the hash.
let hashOnce: Promise<string> | undefined;
const testHash = () => (hashOnce ??= bcrypt.hash(TEST_PASSWORD, 4));

export const uniqueEmail = (label: string) => `${label}-${randomUUID().slice(0, 12)}@test.example`;

/** Adds one active member with TEST_PASSWORD to an organisation. */
export async function addMember(
  db: Knex,
  orgId: string,
  role: Role,
  opts: { status?: 'active' | 'invited' | 'deactivated'; email?: string; name?: string } = {},
): Promise<TestMember> {
  const email = opts.email ?? uniqueEmail(role);
  const name = opts.name ?? `Test ${role[0].toUpperCase()}${role.slice(1)}`;
  const status = opts.status ?? 'active';
  const [row] = await db('users')
    .insert({ email, name, password_hash: status === 'invited' ? null : await testHash() })
    .returning('id');
  await db('memberships').insert({ organisation_id: orgId, user_id: row.id, role, status });
  return { id: row.id, name, email, password: TEST_PASSWORD, role, orgId };
}

/** A fresh organisation with an active admin, engineer and surveyor. */
export async function createOrgWithMembers(db: Knex, name = `Test Salvage ${randomUUID().slice(0, 8)}`): Promise<TestOrg> {
  const [org] = await db('organisations').insert({ name }).returning('id');
  const admin = await addMember(db, org.id, 'admin');
  const engineer = await addMember(db, org.id, 'engineer');
  const surveyor = await addMember(db, org.id, 'surveyor');
  return { id: org.id, name, admin, engineer, surveyor, members: { admin, engineer, surveyor } };
}

export interface SignedIn {
  accessToken: string;
  /** `brineline_refresh=…`, ready for a Cookie header. */
  cookie: string;
}

/** The `name=value` part of the refresh cookie a response set, or '' when none. */
export function refreshCookieOf(res: Response): string {
  const set = res.headers.getSetCookie().find((c) => c.startsWith('brineline_refresh='));
  return set ? set.split(';')[0] : '';
}

export async function signIn(url: string, email: string, password: string = TEST_PASSWORD): Promise<SignedIn> {
  const res = await fetch(`${url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${await res.text()}`);
  const body = (await res.json()) as { accessToken: string };
  return { accessToken: body.accessToken, cookie: refreshCookieOf(res) };
}

export const authHeader = (token: string): Record<string, string> => ({ authorization: `Bearer ${token}` });
