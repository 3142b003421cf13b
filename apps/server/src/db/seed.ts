// The demo shop: invented people in an invented repair shop. Idempotent: fixed ids, inserts that skip rows
// already there, so running it on every start seeds nothing twice.
import { eq } from 'drizzle-orm';
import type { Role } from '@splitscope/contract';
import type { Db } from './client';
import { users } from './schema';
import { INDOOR_FAN_BOARD, OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import { createBoardModel, createCustomer, createJob, createShop, createUser } from '../testing/factories';
import { DEMO_BOARD_IDS } from '../testing/requests';
import { seedReviewJob } from './seed-review';
import { seedDemoLogo } from './demo-logo';
import type { Storage } from '../storage/storage';

export const DEMO_PASSWORD = 'splitscope-demo';

export const DEMO_SHOP = { id: 'shop-demo', name: 'Harbour Lane Board Repair' };
export const OTHER_SHOP = { id: 'shop-other', name: 'Ridgeview Climate Electronics' };

export const DEMO_USERS: { id: string; shopId: string; email: string; name: string; role: Role }[] = [
  { id: 'user-admin', shopId: DEMO_SHOP.id, email: 'admin@demo.test', name: 'Ines Okafor', role: 'admin' },
  { id: 'user-lead', shopId: DEMO_SHOP.id, email: 'lead@demo.test', name: 'Tomas Brandt', role: 'lead' },
  { id: 'user-tech', shopId: DEMO_SHOP.id, email: 'tech@demo.test', name: 'Priya Nair', role: 'tech' },
  { id: 'user-trainee', shopId: DEMO_SHOP.id, email: 'trainee@demo.test', name: 'Leo Marchetti', role: 'trainee' },
  { id: 'user-other-tech', shopId: OTHER_SHOP.id, email: 'tech@other.test', name: 'Dana Whitfield', role: 'tech' },
];

/** Invented customers: contracting firms and field technicians who send boards in. */
export const DEMO_CUSTOMERS = [
  {
    id: 'customer-coastline',
    shopId: DEMO_SHOP.id,
    name: 'Marta Keel',
    company: 'Coastline Comfort Contractors',
    email: 'service@coastline.test',
    phone: '555-0141',
    kind: 'contractor' as const,
    notes: 'Sends boards in batches on Mondays.',
  },
  {
    id: 'customer-northgate',
    shopId: DEMO_SHOP.id,
    name: 'Rafael Osei',
    company: 'Northgate Heating & Cooling',
    email: 'rafael@northgate.test',
    phone: '555-0172',
    kind: 'contractor' as const,
    notes: null,
  },
  {
    id: 'customer-jun',
    shopId: DEMO_SHOP.id,
    name: 'Jun Halvorsen',
    company: null,
    email: 'jun.h@fieldmail.test',
    phone: '555-0119',
    kind: 'field-technician' as const,
    notes: 'Works alone; prefers a call before a quote.',
  },
  {
    id: 'customer-other',
    shopId: OTHER_SHOP.id,
    name: 'Ada Brennan',
    company: 'Ridge Air Services',
    email: 'ada@ridgeair.test',
    phone: '555-0190',
    kind: 'contractor' as const,
    notes: null,
  },
];

/** Seeds the demo; returns how many users it created (0 on a second run). */
export async function seedDemo(db: Db, storage: Storage): Promise<{ created: number }> {
  await createShop(db, DEMO_SHOP);
  await createShop(db, OTHER_SHOP);
  let created = 0;
  for (const u of DEMO_USERS) {
    const [exists] = await db.select({ id: users.id }).from(users).where(eq(users.id, u.id));
    if (exists) continue;
    await createUser(db, { ...u, password: DEMO_PASSWORD });
    created++;
  }
  for (const c of DEMO_CUSTOMERS) await createCustomer(db, c);
  await seedDemoBench(db);
  await seedReviewJob(db);
  await seedDemoLogo(db, storage, DEMO_SHOP.id, 'user-admin');
  return { created };
}

/** The demo bench: the outdoor and indoor fan-drive boards, and jobs for the technician and the trainee (fixed ids). */
async function seedDemoBench(db: Db): Promise<void> {
  const board = await createBoardModel(db, { shopId: DEMO_SHOP.id, createdBy: 'user-admin', id: DEMO_BOARD_IDS.outdoorFan, document: OUTDOOR_FAN_BOARD });
  await createBoardModel(db, { shopId: OTHER_SHOP.id, createdBy: 'user-other-tech', id: 'board-other-ofd-220', document: OUTDOOR_FAN_BOARD });
  await createBoardModel(db, { shopId: DEMO_SHOP.id, createdBy: 'user-admin', id: DEMO_BOARD_IDS.indoorFan, document: INDOOR_FAN_BOARD });
  const base = { shopId: DEMO_SHOP.id, createdBy: 'user-tech', boardId: board.id, faultCode: 'F7' };
  await createJob(db, {
    ...base,
    id: 'job-demo-fan-1',
    customerId: 'customer-coastline',
    unitDescription: 'Outdoor unit, 3.5 kW heat pump',
    serial: 'DEMO-0001',
    symptom: 'Outdoor fan never starts; compressor stops after a minute',
    assigneeId: 'user-tech',
  });
  await createJob(db, {
    ...base,
    id: 'job-demo-fan-2',
    customerId: 'customer-jun',
    unitDescription: 'Outdoor unit, 2.5 kW',
    serial: 'DEMO-0002',
    symptom: 'Fan starts, then the unit stops with F7',
    assigneeId: 'user-trainee',
  });
  await createJob(db, {
    ...base,
    id: 'job-demo-fan-3',
    customerId: 'customer-northgate',
    unitDescription: 'Outdoor unit, 5 kW',
    serial: 'DEMO-0003',
    symptom: 'Outdoor fan never starts',
    assigneeId: 'user-tech',
  });
  await createJob(db, {
    shopId: OTHER_SHOP.id,
    createdBy: 'user-other-tech',
    boardId: 'board-other-ofd-220',
    customerId: 'customer-other',
    id: 'job-other-1',
    unitDescription: 'Outdoor unit',
    serial: 'OTHER-0001',
    symptom: 'Fan never starts',
    faultCode: 'F7',
  });
}
