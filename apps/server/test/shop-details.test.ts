// A real shop's details reach its customers: the quote and invoice e-mails (signed with the shop's address,
// phone, e-mail and tax number, sent under its name), the report PDF's lines and the customer page. Nothing of
// the invented demo shop ("Harbour Lane", "Splitscope Demo") appears in shop mode.
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PublicJob, RepairReport } from '@splitscope/contract';
import { startSmtpCapture, type SmtpCapture } from '../dev/fakes/smtp-capture';
import { boardModels, boardModelVersions, jobs } from '../src/db/schema';
import { reportLines } from '../src/features/reports/pdf';
import { newId } from '../src/lib/ids';
import type { RunningServer } from '../src/server';
import { Client, createEmptyDatabase, startTestServer } from './harness';
import { linkIn } from './billing-fixture';
import sharp from 'sharp';
import { LOGO_BOX } from '../src/features/shops';

const SHOP = {
  name: 'Kestrel Row Electronics',
  address: '12 Kestrel Row\nMillbrook',
  phone: '555-0142',
  email: 'desk@kestrelrow.test',
  taxNumber: 'VAT-778812',
  currency: 'EUR',
};
const DEMO_WORDS = /Harbour Lane|Splitscope Demo/;

let server: RunningServer;
let smtp: SmtpCapture;
let empty: Awaited<ReturnType<typeof createEmptyDatabase>>;
let admin: Client;
let dir: string;
let jobNumber = 0;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'splitscope-shop-mail-'));
  smtp = await startSmtpCapture({ port: 0, dir });
  empty = await createEmptyDatabase(`splitscope_shopdetails_${process.pid}`);
  server = await startTestServer({
    DATABASE_URL: empty.url,
    SPLITSCOPE_MODE: 'shop',
    SMTP_PORT: String(smtp.port),
    MAIL_CAPTURE_DIR: dir,
    LOCAL_FAKES: '1',
    PAYMENTS_WEBHOOK_SECRET: `whsec_${randomBytes(24).toString('base64url')}`,
  });
  admin = new Client(server.url);
  const setup = await admin.post('/api/setup', { shop: SHOP, admin: { name: 'Ines Varga', email: 'ines@kestrelrow.test', password: 'kestrel-row-bench-4' } });
  expect(setup.status).toBe(204);
});
afterAll(async () => {
  await server?.close();
  await smtp?.close();
  await empty?.drop();
  rmSync(dir, { recursive: true, force: true });
});

/** A customer made through the API, and a job of theirs on a board of the shop. */
async function customerJob(email: string) {
  const shopId = String((await admin.get('/api/shop')).body.id);
  const customer = await admin.post('/api/customers', { name: 'Oda Lindqvist', email, kind: 'contractor' });
  expect(customer.status).toBe(201);
  const db = server.ctx.db;
  const boardId = newId();
  const versionId = newId();
  await db.insert(boardModels).values({ id: boardId, shopId, key: `kestrel-${boardId.slice(0, 8)}`, name: 'Outdoor fan board KR-1', currentVersion: 1 });
  await db.insert(boardModelVersions).values({ id: versionId, boardId, version: 1, document: {}, expectedReadings: [] });
  const id = newId();
  jobNumber++;
  await db.insert(jobs).values({
    id,
    shopId,
    number: jobNumber,
    customerId: String(customer.body.id),
    unitDescription: 'Wall split outdoor unit',
    boardId,
    boardVersionId: versionId,
    symptom: 'fan never starts',
    status: 'received',
    createdBy: (await admin.get('/api/me')).body.id as string,
  });
  return { id, db };
}

describe("the shop's details where customers see them", () => {
  it('signs the quote and invoice e-mails, heads the report PDF and the customer page', async () => {
    const email = 'oda.lindqvist@contractor.example.test';
    const { id: jobId, db } = await customerJob(email);
    const quote = await admin.post(`/api/jobs/${jobId}/quotes`, {
      lines: [{ kind: 'labour', description: 'Bench diagnosis', quantity: '1', unitCents: 4500 }],
    });
    expect(quote.status).toBe(201);
    expect((await admin.post(`/api/quotes/${quote.body.id as string}/send`)).status).toBe(200);
    const quoteMail = await smtp.waitFor((m) => m.to.some((t) => t.includes(email)) && m.subject.startsWith('Quote'));
    for (const mail of [quoteMail]) {
      for (const words of ['Kestrel Row Electronics', '12 Kestrel Row', 'Millbrook', 'Phone 555-0142', 'desk@kestrelrow.test', 'Tax number VAT-778812']) {
        expect(mail.text, words).toContain(words);
        expect(mail.html, words).toContain(words);
      }
      expect(mail.from).toContain('Kestrel Row Electronics');
      expect(`${mail.from} ${mail.text} ${mail.html}`).not.toMatch(DEMO_WORDS);
    }

    // the customer page, through the link in the mail
    const page = await new Client(server.url).get(`/api/public/links/${linkIn(quoteMail)}`);
    expect(page.status).toBe(200);
    expect((page.body as unknown as PublicJob).shop).toEqual({
      name: SHOP.name,
      address: SHOP.address,
      phone: SHOP.phone,
      email: SHOP.email,
      taxNumber: SHOP.taxNumber,
      hasLogo: false,
    });
    expect(JSON.stringify(page.body)).not.toMatch(DEMO_WORDS);

    // approved by the customer, repaired and verified: the invoice e-mail carries the shop's details and the report PDF
    expect((await new Client(server.url).post(`/api/public/links/${linkIn(quoteMail)}/quotes/${quote.body.id as string}/approve`)).status).toBe(200);
    await db.update(jobs).set({ status: 'verified' }).where(eq(jobs.id, jobId));
    const invoice = await admin.post(`/api/jobs/${jobId}/invoices`, { quoteId: quote.body.id, send: true });
    expect(invoice.status, JSON.stringify(invoice.body)).toBe(201);
    const invoiceMail = await smtp.waitFor((m) => m.to.some((t) => t.includes(email)) && m.subject.startsWith('Invoice'));
    expect(invoiceMail.text).toContain('Tax number VAT-778812');
    expect(invoiceMail.text).toContain('12 Kestrel Row');
    expect(invoiceMail.attachments.map((a) => a.contentType)).toContain('application/pdf');
    expect(`${invoiceMail.from} ${invoiceMail.text} ${invoiceMail.html}`).not.toMatch(DEMO_WORDS);

    // the PDF's lines: the shop's name, address, phone, e-mail and tax number at the top
    const report = (await admin.get(`/api/jobs/${jobId}/report`)).body as unknown as RepairReport;
    const lines = reportLines(report).map((l) => l.text);
    expect(lines.slice(0, 6)).toEqual([
      'Kestrel Row Electronics',
      '12 Kestrel Row',
      'Millbrook',
      'Phone 555-0142',
      'desk@kestrelrow.test',
      'Tax number VAT-778812',
    ]);
    expect(lines.join('\n')).not.toMatch(DEMO_WORDS);
  });

  it('follows an edit of the shop details on the next e-mail and report', async () => {
    expect((await admin.patch('/api/shop', { phone: '555-0199', taxNumber: 'VAT-990001' })).status).toBe(200);
    const email = 'pim.achterberg@contractor.example.test';
    const { id: jobId } = await customerJob(email);
    const quote = await admin.post(`/api/jobs/${jobId}/quotes`, {
      lines: [{ kind: 'labour', description: 'Bench diagnosis', quantity: '1', unitCents: 4500 }],
    });
    expect((await admin.post(`/api/quotes/${quote.body.id as string}/send`)).status).toBe(200);
    const mail = await smtp.waitFor((m) => m.to.some((t) => t.includes(email)));
    expect(mail.text).toContain('Phone 555-0199');
    expect(mail.text).toContain('Tax number VAT-990001');
    const report = (await admin.get(`/api/jobs/${jobId}/report`)).body as unknown as RepairReport;
    expect(reportLines(report).map((l) => l.text)).toContain('Tax number VAT-990001');
  });

  it("heads the report PDF and the customer page with the shop's logo, fitted to a header; refuses a file that is not a picture in words", async () => {
    const upload = (bytes: Buffer, type: string) =>
      fetch(`${server.url}/api/uploads?name=logo`, { method: 'POST', headers: { 'content-type': type, cookie: admin.cookie }, body: bytes });
    // a 1600 × 1200 photo-sized JPEG: kept as a copy at most LOGO_BOX
    const big = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: '#1d6f42' } })
      .jpeg()
      .toBuffer();
    const up = await upload(big, 'image/jpeg');
    expect(up.status).toBe(201);
    const set = await admin.patch('/api/shop', { logoUploadId: ((await up.json()) as { id: string }).id });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    const logoId = set.body.logoUploadId as string;
    const stored = await fetch(`${server.url}/api/uploads/${logoId}`, { headers: { cookie: admin.cookie } });
    const meta = await sharp(Buffer.from(await stored.arrayBuffer())).metadata();
    expect(meta.format).toBe('png');
    expect(meta.width! <= LOGO_BOX.width && meta.height! <= LOGO_BOX.height).toBe(true);
    expect(meta.width! / meta.height!).toBeCloseTo(1600 / 1200, 1);

    // a text file named like a picture: refused, in words, and the logo stays as it was
    const text = await upload(Buffer.from('not a picture at all'), 'image/png');
    expect(text.status).toBe(415);
    expect(((await text.json()) as { detail: string }).detail).toMatch(/PNG and JPEG/);
    expect((await admin.get('/api/shop')).body.logoUploadId).toBe(logoId);

    // the customer page says there is a logo and fetches it through its link; the PDF draws it at its head
    const email = 'wren.soto@contractor.example.test';
    const { id: jobId, db } = await customerJob(email);
    const quote = await admin.post(`/api/jobs/${jobId}/quotes`, {
      lines: [{ kind: 'labour', description: 'Bench diagnosis', quantity: '1', unitCents: 4500 }],
    });
    expect((await admin.post(`/api/quotes/${quote.body.id as string}/send`)).status).toBe(200);
    const token = linkIn(await smtp.waitFor((m) => m.to.some((t) => t.includes(email))));
    const customer = new Client(server.url);
    expect(((await customer.get(`/api/public/links/${token}`)).body as unknown as PublicJob).shop.hasLogo).toBe(true);
    const logo = await fetch(`${server.url}/api/public/links/${token}/logo`);
    expect(logo.status).toBe(200);
    expect(logo.headers.get('content-type')).toBe('image/png');
    expect((await sharp(Buffer.from(await logo.arrayBuffer())).metadata()).width).toBe(meta.width);
    expect((await fetch(`${server.url}/api/public/links/${'x'.repeat(43)}/logo`)).status).toBe(404);

    await db.update(jobs).set({ status: 'verified' }).where(eq(jobs.id, jobId));
    const pdf = await fetch(`${server.url}/api/public/links/${token}/report.pdf`);
    expect(pdf.status).toBe(200);
    const bytes = Buffer.from(await pdf.arrayBuffer()).toString('latin1');
    // one picture object, drawn on the first page (pdfkit names images /I1, /I2 … in the page's resources)
    expect(bytes.match(/\/Subtype \/Image/g)?.length).toBe(1);
    expect(bytes).toMatch(/\/XObject <<\s*\/I1 /);

    // removed again: no logo on the page, the logo link answers 404
    expect((await admin.patch('/api/shop', { logoUploadId: null })).status).toBe(200);
    expect(((await customer.get(`/api/public/links/${token}`)).body as unknown as PublicJob).shop.hasLogo).toBe(false);
    expect((await fetch(`${server.url}/api/public/links/${token}/logo`)).status).toBe(404);
    const plain = Buffer.from(await (await fetch(`${server.url}/api/public/links/${token}/report.pdf`)).arrayBuffer()).toString('latin1');
    expect(plain).not.toMatch(/\/Subtype \/Image/);
  });
});
