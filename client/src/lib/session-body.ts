/**
 * Reads a remembered profile and the server's session answers without zod, so the app shell (which
 * checks the session on every load) does not carry the validation library. Mirrors `MeSchema` and
 * `SessionResponseSchema` in shared/api/auth.ts: same fields, same checks, unknown keys dropped.
 */
import type { Me, SessionResponse, UnitSystem } from '@shared/api/auth';
import type { Role } from '@shared/api/roles';

// The records make the compiler list every role and unit system, so a new one cannot be forgotten here.
const ROLES: Record<Role, true> = { admin: true, engineer: true, surveyor: true };
const UNIT_SYSTEMS: Record<UnitSystem, true> = { si: true, us: true };
// The pattern of zod's z.uuid().
const UUID = /^([0-9a-fA-F]{8}-[0-9a-fA-F]{4}-[1-8][0-9a-fA-F]{3}-[89abAB][0-9a-fA-F]{3}-[0-9a-fA-F]{12}|00000000-0000-0000-0000-000000000000|ffffffff-ffff-ffff-ffff-ffffffffffff)$/;

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isUuid = (v: unknown): v is string => typeof v === 'string' && UUID.test(v);
const isKey = <K extends string>(set: Record<K, true>, v: unknown): v is K => typeof v === 'string' && Object.hasOwn(set, v);

/** The profile in `value`, or null when it is not one. */
export function parseMe(value: unknown): Me | null {
  if (!isRecord(value)) return null;
  const { id, name, email, role, unitSystem, organisation } = value;
  if (!isUuid(id) || typeof name !== 'string' || typeof email !== 'string') return null;
  if (!isKey(ROLES, role) || !isKey(UNIT_SYSTEMS, unitSystem)) return null;
  if (!isRecord(organisation) || !isUuid(organisation.id) || typeof organisation.name !== 'string') return null;
  return { id, name, email, role, unitSystem, organisation: { id: organisation.id, name: organisation.name } };
}

/** The session in `value` (sign-in, invitation, refresh answers), or null when it is not one. */
export function parseSessionResponse(value: unknown): SessionResponse | null {
  if (!isRecord(value)) return null;
  const { accessToken, expiresIn } = value;
  if (typeof accessToken !== 'string') return null;
  if (typeof expiresIn !== 'number' || !Number.isSafeInteger(expiresIn) || expiresIn <= 0) return null;
  const user = parseMe(value.user);
  return user ? { accessToken, expiresIn, user } : null;
}
