import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, createTestClock, testPublicUrl, type TestApp } from '../support/test-app.ts';

const clock = createTestClock();
let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ clock });
});
afterAll(() => t.close());

const linkToken = (text: string, kind: 'invite' | 'reset') => {
  const match = new RegExp(`${testPublicUrl}/${kind}/([A-Za-z0-9_-]+)`).exec(text);
  if (!match) throw new Error(`no ${kind} link in: ${text}`);
  return match[1]!;
};

const auditActions = async () => {
  const admin = await t.signInAs('admin');
  const res = await admin.get('/api/audit?pageSize=200');
  return (res.body.items as { action: string; target: string }[]).map((e) => `${e.action} ${e.target}`);
};

describe('invitation', () => {
  it('invites by mail, shows the mail in the outbox, accepts, then signs in', async () => {
    const admin = await t.signInAs('admin');
    const invited = await admin.post('/api/users/invite').send({ email: 'Nico.New@Kestrel.example', name: 'Nico New', role: 'qa' });
    expect(invited.status).toBe(201);
    expect(invited.body.user).toMatchObject({ email: 'nico.new@kestrel.example', role: 'qa', invitePending: true, active: true });

    const list = await admin.get('/api/outbox');
    expect(list.body.items[0]).toMatchObject({ to: 'nico.new@kestrel.example', subject: 'You are invited to Kestrel Devices on Parley' });
    const mail = await admin.get(`/api/outbox/${list.body.items[0].id}`);
    expect(mail.body.text).toContain('Avery Admin has invited you to Kestrel Devices on Parley with the qa role.');
    expect(mail.body.html).toContain('<a href="http://parley.test/invite/');
    const token = linkToken(mail.body.text, 'invite');

    const newcomer = t.request();
    expect((await newcomer.get(`/api/invites/${token}`)).body).toEqual({ email: 'nico.new@kestrel.example', name: 'Nico New', role: 'qa' });
    const short = await t.request().post(`/api/invites/${token}/accept`).send({ password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.message).toBe('password: must be at least 10 characters');

    const accepted = await t.request().post(`/api/invites/${token}/accept`).send({ password: 'correct-horse-42', name: 'Nico N.' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({ email: 'nico.new@kestrel.example', name: 'Nico N.', role: 'qa' });
    expect(accepted.headers['set-cookie']?.[0]).toMatch(/^parley_session=.+; .*HttpOnly; .*SameSite=Lax/);

    const again = await t.request().post(`/api/invites/${token}/accept`).send({ password: 'correct-horse-42' });
    expect(again.status).toBe(404);
    const login = await t.request().post('/api/auth/login').send({ email: 'nico.new@kestrel.example', password: 'correct-horse-42' });
    expect(login.status).toBe(200);
    expect(await auditActions()).toEqual(expect.arrayContaining(['user.invited nico.new@kestrel.example', 'user.invite_accepted nico.new@kestrel.example']));
  });

  it('refuses to invite an address that already has an account', async () => {
    const admin = await t.signInAs('admin');
    const res = await admin.post('/api/users/invite').send({ email: 'qa@kestrel.example', name: 'Q', role: 'qa' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('user.exists');
  });
});

describe('password reset', () => {
  it('answers 202 whether or not the account exists and mails only real accounts', async () => {
    const unknown = await t.request().post('/api/auth/forgot').send({ email: 'nobody@kestrel.example' });
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual({ ok: true });
    const known = await t.request().post('/api/auth/forgot').send({ email: 'support@kestrel.example' });
    expect(known.status).toBe(202);
    const mail = await t.mailbox.waitFor('support@kestrel.example');
    expect(mail.subject).toBe('Reset your Parley password');
    expect((await t.mailbox.list()).some((m) => m.to.includes('nobody@'))).toBe(false);

    const token = linkToken(mail.text, 'reset');
    const before = await t.signInAs('support');
    const reset = await t.request().post('/api/auth/reset').send({ token, password: 'a-new-password-1' });
    expect(reset.status).toBe(200);
    expect(reset.body.user.email).toBe('support@kestrel.example');
    // The token works once, the old password is gone, and older sessions end.
    expect((await t.request().post('/api/auth/reset').send({ token, password: 'another-password' })).status).toBe(404);
    expect((await t.request().post('/api/auth/login').send({ email: 'support@kestrel.example', password: 'parley-demo' })).status).toBe(401);
    expect((await before.get('/api/me')).status).toBe(401);
    expect((await t.request().post('/api/auth/login').send({ email: 'support@kestrel.example', password: 'a-new-password-1' })).status).toBe(200);
    expect(await auditActions()).toEqual(expect.arrayContaining(['auth.reset_requested support@kestrel.example', 'auth.password_reset support@kestrel.example']));
  });

  it('refuses an expired reset link', async () => {
    const after = (await t.mailbox.list())[0]?.id ?? 0;
    await t.request().post('/api/auth/forgot').send({ email: 'engineer@kestrel.example' });
    const token = linkToken((await t.mailbox.waitFor('engineer@kestrel.example', { after })).text, 'reset');
    clock.advance(61 * 60_000);
    const res = await t.request().post('/api/auth/reset').send({ token, password: 'a-new-password-2' });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('token.invalid');
  });
});

describe('sessions', () => {
  it('signs in, reads /api/me, signs out', async () => {
    const viewer = await t.signInAs('viewer');
    expect((await viewer.get('/api/me')).body).toMatchObject({ user: { email: 'viewer@kestrel.example', role: 'viewer' }, organisation: { name: 'Kestrel Devices' } });
    expect((await viewer.post('/api/auth/logout')).status).toBe(204);
    expect((await viewer.get('/api/me')).status).toBe(401);
  });

  it('ends a session after 12 hours', async () => {
    const viewer = await t.signInAs('viewer');
    clock.advance(12 * 3_600_000 + 1000);
    expect((await viewer.get('/api/me')).status).toBe(401);
  });

  it('refuses a bearer token while no verifier is installed', async () => {
    const res = await t.request().get('/api/me').set('Authorization', 'Bearer abc');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('token.not-accepted');
  });
});

describe('user administration', () => {
  it('deactivation ends the session and blocks sign-in; reactivation restores it', async () => {
    const admin = await t.signInAs('admin');
    const engineer = await t.signInAs('engineer');
    const users = (await admin.get('/api/users')).body.items as { id: number; email: string }[];
    const id = users.find((u) => u.email === 'engineer@kestrel.example')!.id;

    const off = await admin.patch(`/api/users/${id}`).send({ active: false });
    expect(off.status).toBe(200);
    expect(off.body.user.active).toBe(false);
    expect((await engineer.get('/api/me')).status).toBe(401);
    const login = await t.request().post('/api/auth/login').send({ email: 'engineer@kestrel.example', password: 'parley-demo' });
    expect(login.status).toBe(401);
    expect(login.body.error.code).toBe('account.deactivated');

    expect((await admin.patch(`/api/users/${id}`).send({ active: true })).status).toBe(200);
    expect((await t.request().post('/api/auth/login').send({ email: 'engineer@kestrel.example', password: 'parley-demo' })).status).toBe(200);
  });

  it('changes a role and records it', async () => {
    const admin = await t.signInAs('admin');
    const users = (await admin.get('/api/users')).body.items as { id: number; email: string }[];
    const id = users.find((u) => u.email === 'viewer@kestrel.example')!.id;
    const res = await admin.patch(`/api/users/${id}`).send({ role: 'support' });
    expect(res.body.user.role).toBe('support');
    const audit = await admin.get('/api/audit?page=1&pageSize=1');
    expect(audit.body.items).toHaveLength(1);
    expect(audit.body.total).toBeGreaterThan(1);
    expect(audit.body.items[0]).toMatchObject({ action: 'user.role_changed', target: 'viewer@kestrel.example', actor: { email: 'admin@kestrel.example' }, details: { from: 'viewer', to: 'support' } });
    await admin.patch(`/api/users/${id}`).send({ role: 'viewer' });
  });

  it('will not let an admin deactivate or demote themself', async () => {
    const admin = await t.signInAs('admin');
    const me = (await admin.get('/api/me')).body.user as { id: number };
    const off = await admin.patch(`/api/users/${me.id}`).send({ active: false });
    expect(off.status).toBe(400);
    expect(off.body.error.message).toBe('active: you cannot deactivate your own account');
    const demote = await admin.patch(`/api/users/${me.id}`).send({ role: 'viewer' });
    expect(demote.status).toBe(400);
    expect(demote.body.error.message).toBe('role: you cannot change your own role');
  });

  it('records failed and successful sign-ins', async () => {
    await t.request().post('/api/auth/login').send({ email: 'qa@kestrel.example', password: 'not-the-password' });
    expect(await auditActions()).toEqual(expect.arrayContaining(['auth.sign_in_failed qa@kestrel.example', 'auth.sign_in admin@kestrel.example']));
  });
});

describe('devices', () => {
  it('lists the demo devices and lets qa add and edit one; viewers only read', async () => {
    const qa = await t.signInAs('qa');
    const list = await qa.get('/api/devices');
    expect(list.body.items.map((d: { name: string }) => d.name)).toEqual(['Kestrel D100 desk charger', 'Kestrel K65 travel adapter', 'Kestrel Wren 14 laptop']);
    const created = await qa.post('/api/devices').send({ name: 'Kestrel P20 power bank', role: 'source', pdpW: 20, pdos: ['0x0001912C'] });
    expect(created.status).toBe(201);
    expect(created.body.device).toMatchObject({ pdos: ['0001912c'], maker: '', notes: '' });
    const edited = await qa.patch(`/api/devices/${created.body.device.id}`).send({ notes: 'Two ports' });
    expect(edited.body.device.notes).toBe('Two ports');
    const viewer = await t.signInAs('viewer');
    expect((await viewer.patch(`/api/devices/${created.body.device.id}`).send({ notes: 'x' })).status).toBe(403);
    expect((await qa.patch('/api/devices/999999').send({ notes: 'x' })).status).toBe(404);
  });
});
