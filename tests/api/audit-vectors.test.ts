/** The audit log records each change to a vector (created, edited, restored, deleted) and filters by action family, person and target. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, createTestClock, type TestApp } from '../support/test-app.ts';

const vector = {
  vector: 1,
  id: 'caps/power-rules/audit-45w',
  title: 'A 45 W source must offer 9 V',
  tags: ['power-rules'],
  ref: 'USB PD R3.1, §10.2.3',
  kind: 'caps',
  input: { pdos: ['0x0001912c', '0x0004b12c', '0x000640e1'], pdpW: 45 },
  expect: { findings: { include: ['caps.power-rules-missing'], exclude: [] } },
};
const path = `/api/vectors/${encodeURIComponent(vector.id)}`;

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ clock: createTestClock() });
});
afterAll(() => t.close());

describe('audit of vector changes', () => {
  it('records create, edit, restore and delete, and filters them', async () => {
    const qa = await t.signInAs('qa');
    expect((await qa.post('/api/vectors').send(vector)).status).toBe(201);
    expect((await qa.put(path).send({ ...vector, title: 'Edited title', revision: 1 })).status).toBe(200);
    expect((await qa.post(`${path}/restore`).send({ revision: 1 })).status).toBe(200);
    expect((await qa.delete(path)).status).toBe(204);

    const admin = await t.signInAs('admin');
    const family = await admin.get('/api/audit?action=vector.&pageSize=50');
    expect(family.status, JSON.stringify(family.body)).toBe(200);
    expect((family.body.items as { action: string }[]).map((e) => e.action)).toEqual(['vector.deleted', 'vector.restored', 'vector.updated', 'vector.created']);
    expect(family.body.items[1]).toMatchObject({ target: `vector:${vector.id}`, details: { from: 1, revision: 3 }, actor: { name: 'Quinn Tester' } });

    const one = await admin.get('/api/audit?action=vector.restored');
    expect(one.body.total).toBe(1);
    const byPerson = await admin.get('/api/audit?action=vector.&actor=nobody@');
    expect(byPerson.body.total).toBe(0);
    const byTarget = await admin.get(`/api/audit?target=${encodeURIComponent('audit-45w')}`);
    expect(byTarget.body.total).toBe(4);
    const bad = await admin.get('/api/audit?action=vector%3B%20drop');
    expect(bad.status).toBe(400);
  });
});
