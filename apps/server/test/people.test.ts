// People of a shop: invitations by e-mail, role and deactivation, own password, sign-out everywhere, and
// password reset by e-mail link, against PostgreSQL and the real SMTP capture server.
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { passwordResets } from '../src/db/schema';
import { startSmtpCapture, type CapturedMessage, type SmtpCapture } from '../dev/fakes/smtp-capture';
import type { RunningServer } from '../src/server';
import { createUser } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let smtp: SmtpCapture;
let dir: string;
let admin: Client;

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

const linkIn = (m: CapturedMessage, path: string) => new RegExp(`${path}/([A-Za-z0-9_-]{43})`).exec(String(m.text))?.[1] ?? '';
const unique = (what: string) => `${what}-${Date.now()}-${Math.random().toString(36).slice(2, 7)}@people.test`;
const PASSWORD = 'copper-trace-bench-9';

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'splitscope-people-'));
  smtp = await startSmtpCapture({ port: 0, dir });
  const port = await freePort();
  server = await startTestServer({
    PORT: String(port),
    PUBLIC_URL: `http://127.0.0.1:${port}`,
    SMTP_PORT: String(smtp.port),
    MAIL_CAPTURE_DIR: dir,
    LOCAL_FAKES: '1',
  });
  admin = await new Client(server.url).signIn('admin@demo.test');
});
afterAll(async () => {
  await server?.close();
  await smtp?.close();
  rmSync(dir, { recursive: true, force: true });
});

async function invite(email: string, role = 'tech') {
  const r = await admin.post('/api/users/invitations', { email, name: 'Noor Vance', role });
  expect(r.status).toBe(201);
  const mail = await smtp.waitFor((m) => m.to.some((t) => t.includes(email)));
  return { invitation: r.body, mail };
}

describe('invitations', () => {
  it('mail the link from the shop, and the link sets a checked password once', async () => {
    const email = unique('inv');
    const { invitation, mail } = await invite(email);
    expect(mail.from).toContain('Harbour Lane Board Repair');
    expect(mail.subject).toBe('You are invited to Harbour Lane Board Repair on Splitscope');
    const token = linkIn(mail, '/invitation');
    expect(token).toBe(invitation.token);
    const c = new Client(server.url);
    const common = await c.post('/api/auth/accept-invitation', { token, password: 'password123' });
    expect(common.status).toBe(422);
    expect(String(common.body.detail)).toMatch(/commonly used/);
    expect((await c.post('/api/auth/accept-invitation', { token, password: PASSWORD })).status).toBe(204);
    expect((await c.get('/api/me')).body).toMatchObject({ email, role: 'tech' });
    expect((await new Client(server.url).post('/api/auth/accept-invitation', { token, password: PASSWORD })).status).toBe(404);
  });

  it('resend mails a new link and the old one stops working', async () => {
    const email = unique('resend');
    const { invitation, mail } = await invite(email, 'trainee');
    const first = linkIn(mail, '/invitation');
    const r = await admin.post(`/api/users/invitations/${String(invitation.id)}/resend`);
    expect(r.status).toBe(200);
    const again = await smtp.waitFor((m) => m.to.some((t) => t.includes(email)) && linkIn(m, '/invitation') !== first);
    const second = linkIn(again, '/invitation');
    expect((await new Client(server.url).post('/api/auth/accept-invitation', { token: first, password: PASSWORD })).status).toBe(404);
    expect((await new Client(server.url).post('/api/auth/accept-invitation', { token: second, password: PASSWORD })).status).toBe(204);
    // An accepted invitation is not resent.
    expect((await admin.post(`/api/users/invitations/${String(invitation.id)}/resend`)).status).toBe(404);
  });
});

describe('deactivation', () => {
  it('ends the person’s sessions at once and refuses their sign-in; reactivation lets them back', async () => {
    const user = await createUser(server.ctx.db, { shopId: 'shop-demo', role: 'tech', password: PASSWORD });
    const c = await new Client(server.url).signIn(user.email, PASSWORD);
    expect((await c.get('/api/me')).status).toBe(200);
    const off = await admin.patch(`/api/users/${user.id}`, { active: false });
    expect(off.status).toBe(200);
    expect(off.body.deactivatedAt).not.toBeNull();
    expect((await c.get('/api/me')).status).toBe(401);
    const again = await new Client(server.url).post('/api/auth/sign-in', { email: user.email, password: PASSWORD });
    expect(again.status).toBe(403);
    expect((await admin.patch(`/api/users/${user.id}`, { active: true })).status).toBe(200);
    await new Client(server.url).signIn(user.email, PASSWORD);
  });

  it('keeps one active admin', async () => {
    const me = await admin.get('/api/me');
    const r = await admin.patch(`/api/users/${String(me.body.id)}`, { active: false });
    expect(r.status).toBe(409);
  });
});

describe('own password and sessions', () => {
  it('a new password needs the current one and ends the other sessions', async () => {
    const user = await createUser(server.ctx.db, { shopId: 'shop-demo', role: 'lead', password: PASSWORD });
    const here = await new Client(server.url).signIn(user.email, PASSWORD);
    const there = await new Client(server.url).signIn(user.email, PASSWORD);
    expect((await here.post('/api/me/password', { currentPassword: 'not-it-at-all', newPassword: 'solder-wick-reel-4' })).status).toBe(403);
    expect((await here.post('/api/me/password', { currentPassword: PASSWORD, newPassword: 'iloveyou12' })).status).toBe(422);
    expect((await here.post('/api/me/password', { currentPassword: PASSWORD, newPassword: 'solder-wick-reel-4' })).status).toBe(204);
    expect((await here.get('/api/me')).status).toBe(200);
    expect((await there.get('/api/me')).status).toBe(401);
    await new Client(server.url).signIn(user.email, 'solder-wick-reel-4');
  });

  it('sign out everywhere ends every session of the person, this one too', async () => {
    const user = await createUser(server.ctx.db, { shopId: 'shop-demo', role: 'tech', password: PASSWORD });
    const a = await new Client(server.url).signIn(user.email, PASSWORD);
    const b = await new Client(server.url).signIn(user.email, PASSWORD);
    const other = await new Client(server.url).signIn('tech@demo.test');
    expect((await a.post('/api/auth/sign-out-everywhere')).status).toBe(204);
    expect((await a.get('/api/me')).status).toBe(401);
    expect((await b.get('/api/me')).status).toBe(401);
    expect((await other.get('/api/me')).status).toBe(200);
  });
});

describe('password reset by e-mail', () => {
  it('mails a single-use link whose token is stored only as a hash, and ends the old sessions', async () => {
    const user = await createUser(server.ctx.db, { shopId: 'shop-demo', role: 'tech', password: PASSWORD });
    const old = await new Client(server.url).signIn(user.email, PASSWORD);
    const r = await new Client(server.url).post('/api/auth/password-reset', { email: user.email });
    expect(r.status).toBe(202);
    const mail = await smtp.waitFor((m) => m.to.some((t) => t.includes(user.email)));
    expect(mail.from).toContain('Harbour Lane Board Repair');
    const token = linkIn(mail, '/reset-password');
    const rows = await server.ctx.db.select().from(passwordResets).where(eq(passwordResets.userId, user.id));
    expect(rows).toHaveLength(1);
    expect(rows[0]!.tokenHash).not.toContain(token);
    expect(rows[0]!.expiresAt.getTime() - rows[0]!.createdAt.getTime()).toBe(30 * 60_000);
    const c = new Client(server.url);
    expect((await c.post('/api/auth/password-reset/confirm', { token, password: 'flux-pen-bench-22' })).status).toBe(204);
    expect((await c.get('/api/me')).body).toMatchObject({ email: user.email });
    expect((await old.get('/api/me')).status).toBe(401);
    expect((await new Client(server.url).post('/api/auth/password-reset/confirm', { token, password: 'flux-pen-bench-23' })).status).toBe(404);
    await new Client(server.url).signIn(user.email, 'flux-pen-bench-22');
  });

  it('an expired link is refused', async () => {
    const user = await createUser(server.ctx.db, { shopId: 'shop-demo', role: 'tech', password: PASSWORD });
    await new Client(server.url).post('/api/auth/password-reset', { email: user.email });
    const token = linkIn(await smtp.waitFor((m) => m.to.some((t) => t.includes(user.email))), '/reset-password');
    await server.ctx.db
      .update(passwordResets)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(passwordResets.userId, user.id));
    expect((await new Client(server.url).post('/api/auth/password-reset/confirm', { token, password: 'flux-pen-bench-22' })).status).toBe(404);
    await new Client(server.url).signIn(user.email, PASSWORD);
  });

  it('answers the same for an unknown address and mails nothing', async () => {
    const before = smtp.messages.length;
    const r = await new Client(server.url).post('/api/auth/password-reset', { email: unique('nobody') });
    expect(r.status).toBe(202);
    await new Promise((res) => setTimeout(res, 300));
    expect(smtp.messages.length).toBe(before);
  });
});
