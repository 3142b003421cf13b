// Photos on the job: a phone photo of about 4 MB is stored resized as an upload (sharp), listed on the job with its
// stored and sent sizes; a refused or damaged picture is recorded on the job with the reason in words, so the job
// shows it (issue: a refused photo must not leave the intake form inviting a second submit).
import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Upload, UploadRefusal } from '@splitscope/contract';
import { KEEP_BYTES, MAX_SIDE } from '../src/features/uploads/picture';
import type { RunningServer } from '../src/server';
import { createBoardModel, createCustomer, createJob } from '../src/testing/factories';
import { Client, startTestServer } from './harness';

let server: RunningServer;
let tech: Client;
let jobId: string;
let photo: Buffer;

/** A 4000×3000 JPEG of noise (noise does not compress, so the file is as large as a phone's), about 4 MB. */
async function phonePhoto(): Promise<Buffer> {
  const w = 4000;
  const h = 3000;
  const raw = Buffer.alloc(w * h * 3);
  let x = 12345;
  for (let i = 0; i < raw.length; i++) {
    x = (x * 1103515245 + 12345) & 0x7fffffff;
    // Smooth-ish noise: neighbouring bytes share their high bits, which brings the JPEG near 4 MB.
    raw[i] = ((i % 3) * 60 + (x >> 24)) & 0xff;
  }
  for (const quality of [60, 50, 40, 30, 70, 80]) {
    const jpeg = await sharp(raw, { raw: { width: w, height: h, channels: 3 } })
      .jpeg({ quality })
      .toBuffer();
    if (jpeg.length >= 3.5e6 && jpeg.length <= 6e6) return jpeg;
  }
  throw new Error('could not make a 4 MB test photo');
}

const send = (bytes: Buffer | string, name: string, type = 'image/jpeg') =>
  fetch(`${server.url}/api/uploads?${new URLSearchParams({ jobId, name })}`, {
    method: 'POST',
    headers: { 'content-type': type, cookie: tech.cookie },
    body: bytes,
  });

beforeAll(async () => {
  server = await startTestServer();
  const db = server.ctx.db;
  const customer = await createCustomer(db, { shopId: 'shop-demo', name: 'Photo Test Contracting' });
  const board = await createBoardModel(db, { shopId: 'shop-demo', createdBy: 'user-admin' });
  jobId = (await createJob(db, { shopId: 'shop-demo', createdBy: 'user-tech', customerId: customer.id, boardId: board.id, idempotencyKey: randomUUID() })).id;
  tech = await new Client(server.url).signIn('tech@demo.test');
  photo = await phonePhoto();
}, 120_000);
afterAll(async () => {
  await server.close();
});

describe('photos on the job', () => {
  it('a 4 MB phone photo is stored resized, upright JPEG within the bounds, and listed on the job', async () => {
    expect(photo.length).toBeGreaterThan(3.5e6);
    const res = await send(photo, 'board-front.jpg');
    expect(res.status).toBe(201);
    const up = (await res.json()) as Upload;
    expect(up).toMatchObject({ contentType: 'image/jpeg', width: MAX_SIDE, height: MAX_SIDE * 0.75, originalSize: photo.length });
    expect(up.size).toBeLessThan(photo.length / 2);
    const stored = Buffer.from(await (await fetch(`${server.url}${up.url}`, { headers: { cookie: tech.cookie } })).arrayBuffer());
    const meta = await sharp(stored).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', MAX_SIDE, MAX_SIDE * 0.75]);
    const list = (await tech.get(`/api/jobs/${jobId}/uploads`)).body as unknown as { items: Upload[] };
    expect(list.items.map((u) => u.id)).toContain(up.id);
  }, 120_000);

  it('a small picture is stored as sent', async () => {
    const small = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#2a6' } })
      .png()
      .toBuffer();
    expect(small.length).toBeLessThan(KEEP_BYTES);
    const res = await send(small, 'small.png', 'image/png');
    expect(res.status).toBe(201);
    expect((await res.json()) as Upload).toMatchObject({ contentType: 'image/png', size: small.length, width: 640, height: 480, originalSize: null });
  });

  it('a refused type and a damaged JPEG are recorded on the job with the reason in words', async () => {
    expect((await send('GIF89a not a board photo', 'board.gif', 'image/gif')).status).toBe(415);
    const damaged = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.alloc(2000, 7)]);
    expect((await send(damaged, 'cut-off.jpg')).status).toBe(415);
    const refusals = (await tech.get(`/api/jobs/${jobId}/upload-refusals`)).body as unknown as { items: UploadRefusal[] };
    expect(refusals.items.map((r) => [r.name, r.reason])).toEqual([
      ['board.gif', 'Only PNG and JPEG pictures are accepted (checked from the file contents; SVG is refused)'],
      ['cut-off.jpg', 'The picture could not be read: the file looks damaged or is not a whole PNG or JPEG'],
    ]);
  });
});
