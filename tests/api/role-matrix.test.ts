import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { routeTable } from '../../server/routes.ts';
import { roles, type Role } from '../../server/db/entities.ts';
import type { RouteDef } from '../../server/route-def.ts';
import { createTestApp, type TestApp } from '../support/test-app.ts';

/**
 * Every route of the table × every role and an anonymous caller. Built from the table itself,
 * so a route added later is checked without touching this file.
 */
let t: TestApp;
const cookies = new Map<Role, string>();

beforeAll(async () => {
  t = await createTestApp({ rateLimits: { login: { windowMs: 60_000, limit: 1000 }, forgot: { windowMs: 60_000, limit: 1000 } } });
  for (const role of roles) cookies.set(role, await t.cookieFor(role));
});
afterAll(() => t.close());

/** Path parameters get a harmless value: ids of nothing, tokens that do not exist. */
const concretePath = (path: string) => path.replace(/:([A-Za-z]+)/g, (_m, name: string) => (name === 'id' ? '999999' : 'no-such-token-0000'));

const allowed = (def: RouteDef, role: Role | null) => def.access === 'anyone' || (role !== null && (def.access === 'signed-in' || def.access.includes(role)));

// Logout ends every session of the account on the server, so after its row each role signs in afresh.
describe.each(routeTable.map((def) => [`${def.method.toUpperCase()} ${def.path}`, def] as const))('%s', (_name, def) => {
  it.each([...roles, null].map((role) => [role ?? 'anonymous', role] as const))('as %s', async (_label, role) => {
    let req = t.request()[def.method](concretePath(def.path));
    if (role) req = req.set('Cookie', cookies.get(role)!);
    const res = def.method === 'get' || def.method === 'delete' ? await req : await req.send({});
    if (role && def.path === '/api/auth/logout') cookies.set(role, await t.cookieFor(role));
    if (allowed(def, role)) {
      expect([401, 403], JSON.stringify(res.body)).not.toContain(res.status);
    } else {
      expect(res.status).toBe(role === null ? 401 : 403);
      expect(res.body.error.code).toBe(role === null ? 'auth.required' : 'role.forbidden');
    }
  });
});

describe('the route table', () => {
  it('is what Express serves: no /api route exists outside it', () => {
    const router = t.app.router as unknown as { stack: { route?: { path: string; methods: Record<string, boolean> }; handle: { stack?: unknown[] } }[] };
    const registered: string[] = [];
    const walk = (stack: typeof router.stack) => {
      for (const layer of stack) {
        if (layer.route) for (const m of Object.keys(layer.route.methods)) registered.push(`${m} ${layer.route.path}`);
        else if (Array.isArray(layer.handle.stack)) walk(layer.handle.stack as typeof router.stack);
      }
    };
    walk(router.stack);
    const api = registered.filter((r) => r.split(' ')[1]!.startsWith('/api'));
    // Plus, once more, the fast path of each route whose answers are kept (server/middleware/kept-reads.ts).
    const fastPaths = routeTable.filter((d) => d.method === 'get' && d.keep);
    expect(fastPaths.length).toBeGreaterThan(0);
    expect(api.sort()).toEqual([...routeTable, ...fastPaths].map((d) => `${d.method} ${d.path}`).sort());
  });

  it('has no duplicate method and path', () => {
    const keys = routeTable.map((d) => `${d.method} ${d.path}`);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it('keeps the contract routes of api.md with their roles', () => {
    const access = (method: string, path: string) => routeTable.find((d) => d.method === method && d.path === path)?.access;
    expect(access('get', '/api/health')).toBe('anyone');
    expect(access('post', '/api/auth/login')).toBe('anyone');
    expect(access('post', '/api/auth/logout')).toBe('signed-in');
    expect(access('get', '/api/me')).toBe('signed-in');
    expect(access('get', '/api/users')).toEqual(['admin']);
    expect(access('post', '/api/devices')).toEqual(['admin', 'engineer', 'qa']);
  });
});
