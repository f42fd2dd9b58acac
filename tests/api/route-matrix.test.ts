/**
 * Every API route, every kind of caller. Part one walks the Express router itself and fails for a
 * route registered without a policy (that is, outside defineRoutes). Part two calls every
 * registered route as admin, engineer, surveyor, signed-out and another organisation's admin, and
 * checks the exact status from tests/api/route-cases.ts; it also checks that no answer ever
 * carries a password hash.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Router } from 'express';
import { startTestApp, type TestApp } from '../support/app';
import { createOrgWithMembers, signIn, type TestOrg } from '../support/auth';
import { callRoute } from '../support/route-call';
import { CALLERS, routeCases, type Caller } from './route-cases';

let t: TestApp;
let org: TestOrg;
let other: TestOrg;
const tokens: Partial<Record<Caller, string>> = {};

beforeAll(async () => {
  t = await startTestApp();
  org = await createOrgWithMembers(t.db);
  other = await createOrgWithMembers(t.db);
  for (const role of ['admin', 'engineer', 'surveyor'] as const) tokens[role] = (await signIn(t.url, org.members[role].email)).accessToken;
  tokens.otherOrg = (await signIn(t.url, other.admin.email)).accessToken;
});
afterAll(async () => {
  await t?.close();
});

interface Layer {
  rawPath?: unknown;
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/** Every route Express will answer, as "METHOD /full/path", found by walking the router stacks. */
function walk(stack: Layer[], prefix = ''): string[] {
  const out: string[] = [];
  for (const layer of stack) {
    const here = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
    if (layer.route) {
      for (const [method, on] of Object.entries(layer.route.methods)) {
        if (on && method !== '_all') out.push(`${method.toUpperCase()} ${prefix}${layer.route.path}`);
      }
    } else if (layer.handle?.stack) {
      out.push(...walk(layer.handle.stack, prefix + here));
    }
  }
  return out;
}

const registered = () => t.app.locals.routes.map((r) => `${r.method.toUpperCase()} ${r.path}`);

describe('route registry', () => {
  it('every route Express answers was declared with a policy', () => {
    const expressRoutes = walk((t.app as unknown as { router: Router & { stack: Layer[] } }).router.stack).filter((r) => r.split(' ')[1].startsWith('/api'));
    expect(expressRoutes.length).toBeGreaterThan(0);
    const declared = new Set(registered());
    const undeclared = expressRoutes.filter((r) => !declared.has(r));
    expect(undeclared, 'routes registered outside defineRoutes (no policy)').toEqual([]);
  });

  it('every declared route has a case in tests/api/route-cases.ts', () => {
    const missing = registered().filter((r) => !routeCases[r]);
    expect(missing, 'add these to tests/api/route-cases.ts').toEqual([]);
  });

  it('no case is left over for a route that no longer exists', () => {
    const declared = new Set(registered());
    expect(Object.keys(routeCases).filter((k) => !declared.has(k))).toEqual([]);
  });
});

describe('route × caller matrix', () => {
  const names = Object.keys(routeCases);
  for (const key of names) {
    it(key, async () => {
      const c = routeCases[key];
      if (!t.app.locals.routes.some((r) => `${r.method.toUpperCase()} ${r.path}` === key)) return;
      const got: Record<string, number> = {};
      for (const caller of CALLERS) {
        const prepared = (await c.setup?.({ t, org, other, caller })) ?? {};
        const res = await callRoute(t.url, key, prepared, tokens[caller]);
        const text = await res.text();
        expect(text, `${key} as ${caller} leaked a password hash`).not.toMatch(/\$2[aby]\$\d\d\$|password_?hash/i);
        got[caller] = res.status;
      }
      expect(got).toEqual(c.expect);
    });
  }
});
