// The billing rig shared by the billing tests: the server with the real SMTP capture server and the fake payment
// API on loopback (the webhook secret is the rig's own random one), and jobs with their own customer and board.
import { eq } from 'drizzle-orm';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'vitest';
import { startFakePayments, type FakePayments } from '../dev/fakes/payments';
import { startSmtpCapture, type CapturedMessage, type SmtpCapture } from '../dev/fakes/smtp-capture';
import type { Db } from '../src/db/client';
import { boardModels, boardModelVersions, customers, jobs } from '../src/db/schema';
import { newId } from '../src/lib/ids';
import type { RunningServer } from '../src/server';
import { Client, startTestServer } from './harness';

export const SHOP = 'shop-demo';

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

export const linkIn = (m: CapturedMessage) => {
  const match = /\/c\/([A-Za-z0-9_-]{43})\b/.exec(m.text ?? '');
  if (!match) throw new Error(`no customer link in: ${m.text}`);
  return match[1]!;
};

export interface BillingRig {
  server: RunningServer;
  smtp: SmtpCapture;
  pay: FakePayments;
  db: Db;
  admin: Client;
  webhookSecret: string;
  /** A job of the demo shop with its own customer and board (billing reads them; it never writes jobs' own data). */
  makeJob(opts: {
    status?: (typeof jobs.$inferInsert)['status'];
    customerName: string;
    email: string | null;
  }): Promise<{ id: string; number: number; customerId: string }>;
  setStatus(id: string, status: (typeof jobs.$inferInsert)['status']): Promise<unknown>;
  close(): Promise<void>;
}

let jobCounter = 0;

export async function startBillingRig(): Promise<BillingRig> {
  const dir = mkdtempSync(join(tmpdir(), 'splitscope-mail-'));
  const webhookSecret = `whsec_${randomBytes(24).toString('base64url')}`;
  const smtp = await startSmtpCapture({ port: 0, dir });
  const pay = await startFakePayments({ port: 0, secretKey: 'sk_test_local_fake', webhookSecret });
  const port = await freePort();
  const server = await startTestServer({
    PORT: String(port),
    PUBLIC_URL: `http://127.0.0.1:${port}`,
    SMTP_PORT: String(smtp.port),
    PAYMENTS_PORT: String(pay.port),
    PAYMENTS_SECRET_KEY: 'sk_test_local_fake',
    PAYMENTS_WEBHOOK_SECRET: webhookSecret,
    MAIL_CAPTURE_DIR: dir,
    LOCAL_FAKES: '1',
  });
  pay.setWebhookUrl(`${server.url}/api/webhooks/payments`);
  const db = server.ctx.db;
  const admin = await new Client(server.url).signIn('admin@demo.test');
  const s = await admin.patch('/api/billing/settings', { taxRate: '8.25', currency: 'usd', notifyOn: [] });
  expect(s.status).toBe(200);

  async function makeJob(opts: { status?: (typeof jobs.$inferInsert)['status']; customerName: string; email: string | null }) {
    const tag = newId().slice(0, 8);
    const boardId = newId();
    const versionId = newId();
    await db
      .insert(boardModels)
      .values({ id: boardId, shopId: SHOP, key: `billing-test-${tag}`, name: `Outdoor fan board ${tag.toUpperCase()}`, currentVersion: 1 });
    await db.insert(boardModelVersions).values({ id: versionId, boardId, version: 1, document: {}, expectedReadings: [] });
    const customerId = newId();
    await db
      .insert(customers)
      .values({ id: customerId, shopId: SHOP, name: opts.customerName, company: 'Tidewater Mechanical (invented)', email: opts.email, kind: 'contractor' });
    const id = newId();
    const number = 900_000 + Math.floor(Math.random() * 90_000) + ++jobCounter;
    await db.insert(jobs).values({
      id,
      shopId: SHOP,
      number,
      customerId,
      unitDescription: 'Wall split outdoor unit, 3.5 kW',
      serial: `SN-${tag}`,
      boardId,
      boardVersionId: versionId,
      faultCode: 'E7',
      symptom: 'outdoor fan never starts',
      status: opts.status ?? 'received',
      createdBy: 'user-lead',
    });
    return { id, number, customerId };
  }

  return {
    server,
    smtp,
    pay,
    db,
    admin,
    webhookSecret,
    makeJob,
    setStatus: (id, status) => db.update(jobs).set({ status, updatedAt: new Date() }).where(eq(jobs.id, id)),
    close: async () => {
      await server.close();
      await smtp.close();
      await pay.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
