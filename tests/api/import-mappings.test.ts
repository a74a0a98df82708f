/** Import mappings are saved per team: listed for everyone signed in, saved and deleted by the roles that upload. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, createTestClock, type TestApp } from '../support/test-app.ts';

const mapping = {
  name: 'K-series console',
  mode: 'pattern',
  pattern: String.raw`^\[\s*(?<time>[\d.]+)\]\s+PD\s+\w+\s+(?<dir>SRC|SNK)\s+(?<data>.+)$`,
  timeUnit: 's',
  data: 'words',
  sourceWords: ['SRC'],
  sinkWords: ['SNK'],
  commentPrefix: '#',
};

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ clock: createTestClock() });
});
afterAll(() => t.close());

describe('import mappings', () => {
  it('saves, lists and deletes a mapping with role checks and clear errors', async () => {
    const support = await t.signInAs('support');
    const saved = await support.post('/api/import-mappings').send(mapping);
    expect(saved.status, JSON.stringify(saved.body)).toBe(201);
    expect(saved.body).toMatchObject({ name: 'K-series console', mapping: { timeUnit: 's', separator: 'whitespace', cableWords: [] }, createdBy: { name: 'Sasha Support' } });

    const viewer = await t.signInAs('viewer');
    const listed = await viewer.get('/api/import-mappings');
    expect(listed.body.items.map((m: { name: string }) => m.name)).toEqual(['K-series console']);
    expect((await viewer.post('/api/import-mappings').send(mapping)).status).toBe(403);
    expect((await t.request().get('/api/import-mappings')).status).toBe(401);

    const again = await support.post('/api/import-mappings').send(mapping);
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('import-mapping.name-taken');
    const bad = await support.post('/api/import-mappings').send({ ...mapping, name: 'broken', pattern: '^(\\d+' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^pattern: not a regular expression/);

    const engineer = await t.signInAs('engineer');
    expect((await engineer.delete(`/api/import-mappings/${saved.body.id}`)).status).toBe(403);
    expect((await support.delete(`/api/import-mappings/${saved.body.id}`)).status).toBe(204);
    expect((await viewer.get('/api/import-mappings')).body.items).toEqual([]);
  });
});
