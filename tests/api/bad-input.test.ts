import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Response } from 'supertest';
import type { z } from 'zod';
import { routeTable } from '../../server/routes.ts';
import type { Role } from '../../server/db/entities.ts';
import type { RouteDef } from '../../server/route-def.ts';
import { createTestApp, type TestApp } from '../support/test-app.ts';

/**
 * A hostile-input sweep over every route of the table (so a route added later is swept too),
 * signed in as a role the route allows: path params, query strings and bodies that no client
 * should send. Whatever the route does with them, the answer is never a 5xx, an error is always
 * the api.md shape with a 4xx status and no stack or file path, and the server keeps answering.
 */
let t: TestApp;
const cookies = new Map<Role, string>();

beforeAll(async () => {
  const generous = { windowMs: 60_000, limit: 100_000 };
  t = await createTestApp({ rateLimits: { login: generous, forgot: generous, share: generous } });
  for (const role of ['admin', 'engineer', 'qa', 'support', 'viewer'] as const) cookies.set(role, await t.cookieFor(role));
});
afterAll(async () => {
  await t.close();
});

/** Admin may call everything but routes that name other roles only; those get their first role. */
function callerFor(def: RouteDef): Role | null {
  if (def.access === 'anyone') return null;
  // Signing out ends every session of the account; the sweep does it as the viewer, whom nothing else uses.
  if (def.path === '/api/auth/logout') return 'viewer';
  if (def.access === 'signed-in' || def.access.includes('admin')) return 'admin';
  return def.access[0]!;
}

const paramNames = (path: string) => [...path.matchAll(/:([A-Za-z]+)/g)].map((m) => m[1]!);

/** Harmless values for the params not under attack: ids and tokens of nothing. */
const harmless = (name: string) => (name === 'token' ? 'no-such-token-0000' : '999999');

/** Already URL-encoded, as they go on the wire. */
const hostileParams: Record<string, string> = {
  huge: 'x'.repeat(8_000),
  'huge number': '9'.repeat(400),
  'non-numeric': 'abc',
  negative: '-1',
  zero: '0',
  fraction: '1.5',
  exponent: '1e999',
  'NUL byte': '%00',
  'encoded traversal': '..%2F..%2F..%2Fetc%2Fpasswd',
  'bad percent-encoding': '%E0%A4%A',
  'unknown id': '424242',
  'unicode and quotes': encodeURIComponent(`'"<script>é😀`),
};

const concretePath = (def: RouteDef, attacked?: string, value?: string) => def.path.replace(/:([A-Za-z]+)/g, (_m, name: string) => (name === attacked && value !== undefined ? value : harmless(name)));

/** The keys of an object schema, looking through refine/transform/strict wrappers. */
function schemaKeys(schema: z.ZodType | undefined): string[] {
  let current: unknown = schema;
  for (let depth = 0; depth < 5 && current; depth += 1) {
    const candidate = current as { shape?: Record<string, unknown>; def?: { in?: unknown; innerType?: unknown; schema?: unknown } };
    if (candidate.shape && typeof candidate.shape === 'object') return Object.keys(candidate.shape);
    current = candidate.def?.in ?? candidate.def?.innerType ?? candidate.def?.schema;
  }
  return [];
}

/** Each level holds the one below twice (2^depth leaves), so a small depth is already a big tree. */
function deeplyNested(depth: number): unknown {
  let value: unknown = 'bottom';
  for (let i = 0; i < depth; i += 1) value = { a: value, b: [value] };
  return value;
}

/** A single chain of objects, far deeper than any schema of ours, as raw JSON text. */
function deepChain(depth: number): string {
  return '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);
}

const wrongValues: Record<string, unknown> = {
  number: 42,
  'negative number': -1,
  'huge number': 1e308,
  boolean: true,
  null: null,
  object: { nested: { deeper: true } },
  array: ['a', 1, null],
  '100 kB string': 'x'.repeat(100_000),
  'NUL string': 'a\u0000b',
};

const stackOrPath = /\bat \S+ \(|\.tsx?:\d+|\.m?js:\d+|node_modules|\/work\/|\/home\/|\/tmp\/|[A-Z]:\\|Error: |SQLITE_|select |insert into /i;

function expectSafe(res: Response, label: string) {
  const where = `${label} → ${res.status} ${res.text.slice(0, 300)}`;
  expect(res.status, where).toBeLessThan(500);
  if (res.status >= 400) {
    expect(res.status, where).toBeGreaterThanOrEqual(400);
    expect(res.headers['content-type'], where).toMatch(/application\/json/);
    expect(res.body, where).toEqual({ error: expect.objectContaining({ code: expect.any(String), message: expect.any(String) }) });
    expect(res.body.error.code, where).not.toBe('server.internal');
    expect(res.text, where).not.toMatch(stackOrPath);
  }
}

function expectRejected(res: Response, label: string, statuses = [400, 404, 409, 413, 415, 429]) {
  expectSafe(res, label);
  expect(statuses, `${label} → ${res.status} ${res.text.slice(0, 300)}`).toContain(res.status);
}

async function expectHealthy() {
  const res = await t.request().get('/api/health');
  expect(res.status).toBe(200);
  expect(res.body).toMatchObject({ ok: true });
}

type Method = RouteDef['method'];
function call(def: RouteDef, path: string, method: Method = def.method) {
  const role = callerFor(def);
  const req = t.request()[method](path);
  return role ? req.set('Cookie', cookies.get(role)!) : req;
}

const withBody = (def: RouteDef) => def.method === 'post' || def.method === 'put' || def.method === 'patch';

describe.each(routeTable.map((def) => [`${def.method.toUpperCase()} ${def.path}`, def] as const))('%s', (_name, def) => {
  const params = paramNames(def.path);

  if (params.length > 0)
    it('rejects hostile path params with 4xx JSON', async () => {
      for (const name of params) {
        for (const [label, value] of Object.entries(hostileParams)) {
          const req = call(def, concretePath(def, name, value));
          const res = withBody(def) ? await req.send({}) : await req;
          expectRejected(res, `:${name} ${label}`);
        }
      }
      await expectHealthy();
    });

  it('survives hostile query strings', async () => {
    const keys = [...new Set([...schemaKeys(def.query), 'page', 'pageSize', 'id', 'wait'])];
    const variants = (key: string) => [
      `${key}=1&${key}=2`,
      `${key}=-1`,
      `${key}=${'9'.repeat(400)}`,
      `${key}=1e999`,
      `${key}=NaN`,
      `${key}=%00`,
      `${key}[x]=1`,
      `${key}=${'q'.repeat(12_000)}`,
      `${key}=%E0%A4%A`,
    ];
    for (const key of keys) {
      for (const qs of variants(key)) {
        const req = call(def, `${concretePath(def)}?${qs}`);
        const res = withBody(def) ? await req.send({}) : await req;
        expectSafe(res, `?${qs.slice(0, 40)}`);
        // A repeated key is an array: no field of ours takes one.
        if (qs.startsWith(`${key}=1&`) && schemaKeys(def.query).includes(key)) expectRejected(res, `?${qs}`);
      }
    }
    await expectHealthy();
  });

  if (withBody(def))
    it('rejects hostile bodies with 4xx JSON', async () => {
      const path = concretePath(def);
      const mustReject = def.body !== undefined;
      const check = (res: Response, label: string) => (mustReject ? expectRejected(res, label) : expectSafe(res, label));

      for (const [label, raw] of Object.entries({
        null: 'null',
        array: '[]',
        'array of objects': '[{"a":1}]',
        string: '"text"',
        number: '42',
        'malformed JSON': '{"a":',
        'trailing garbage': '{}x',
        'empty with JSON type': '',
        'deep nesting (20 000 levels)': deepChain(20_000),
        'proto keys': '{"__proto__":{"admin":true},"constructor":{"prototype":{"x":1}}}',
      })) {
        check(await call(def, path).set('Content-Type', 'application/json').send(raw), `body ${label}`);
      }
      check(await call(def, path).send(deeplyNested(12) as object), 'body nested objects');
      check(await call(def, path).set('Content-Type', 'text/plain').send('{"email":"a@b.example"}'), 'body as text/plain');
      check(await call(def, path).set('Content-Type', 'application/x-www-form-urlencoded').send('a=1&b=2'), 'body form-urlencoded');
      check(await call(def, path).set('Content-Type', 'application/json; charset=utf-16').send('{}'), 'body in utf-16');
      check(await call(def, path).set('Content-Type', 'application/json').set('Content-Encoding', 'x-unknown').send('{}'), 'body with unknown encoding');
      check(await call(def, path).set('Content-Type', 'application/json').set('Content-Encoding', 'gzip').send('not gzip at all'), 'body with broken gzip');
      check(await call(def, path).field('title', 'no file here'), 'multipart without a file');
      check(await call(def, path).attach('not-file', Buffer.from('hello'), 'hello.txt'), 'multipart with the file in another field');
      check(await call(def, path).attach('file', Buffer.alloc(0), 'empty.txt'), 'multipart with an empty file');
      check(await call(def, path).set('Content-Type', 'multipart/form-data').send('--x\r\n'), 'multipart without a boundary');
      check(
        await call(def, path).set('Content-Type', 'multipart/form-data; boundary=xyz').send('--xyz\r\nContent-Disposition: form-data; name="file"; filename="a.txt"\r\n\r\nhalf a file'),
        'multipart cut off mid-file',
      );
      check(await call(def, path).set('Content-Type', 'multipart/form-data; boundary=xyz').send('--xyz\r\nNot-A-Header\r\n\r\n--xyz--\r\n'), 'multipart with a broken part header');

      for (const key of schemaKeys(def.body)) {
        for (const [label, value] of Object.entries(wrongValues)) {
          check(await call(def, path).send({ [key]: value }), `body.${key} as ${label}`);
        }
      }
      await expectHealthy();
    });
});

describe('NUL characters', () => {
  it('are refused in request fields with the field named', async () => {
    const res = await t.request().get('/api/vectors?q=a%00b').set('Cookie', cookies.get('admin')!);
    expectRejected(res, 'q with NUL', [400]);
    expect(res.body.error).toMatchObject({ code: 'input.invalid', message: 'q: must not contain NUL characters (\\u0000)' });
  });

  it('are refused inside posted reports, which no schema reads field by field', async () => {
    const json = await t
      .request()
      .post('/api/runs?project=demo')
      .set('Cookie', cookies.get('admin')!)
      .send({ results: [{ id: 'caps/a\u0000b', ok: false, message: 'x\u0000y' }] });
    expectRejected(json, 'JSON report with NUL', [400]);
    expect(json.body.error.message).toBe('body: text must not contain NUL characters (\\u0000)');
    const xml = await t
      .request()
      .post('/api/runs?project=demo')
      .set('Cookie', cookies.get('admin')!)
      .set('Content-Type', 'application/xml')
      .send('<testsuite><testcase name="caps/a\u0000b" classname="x"><failure message="m"/></testcase></testsuite>');
    expectRejected(xml, 'JUnit report with NUL', [400]);
    await expectHealthy();
  });
});

describe('the sweep itself', () => {
  it('finds the keys of the schemas it attacks', () => {
    const login = routeTable.find((d) => d.method === 'post' && d.path === '/api/auth/login')!;
    expect(schemaKeys(login.body)).toEqual(['email', 'password']);
    const patchDevice = routeTable.find((d) => d.method === 'patch' && d.path === '/api/devices/:id')!;
    expect(schemaKeys(patchDevice.body).length).toBeGreaterThan(0);
  });
});
