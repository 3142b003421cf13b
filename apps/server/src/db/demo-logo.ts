// The invented demo shop's logo, drawn here (an SVG of shapes, no lettering, no brand) and rendered to PNG with
// `sharp`, so the demo's report PDF and customer page show how a shop's logo heads them.
import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import type { Db } from './client';
import { shops } from './schema';
import type { Storage } from '../storage/storage';
import { storeUpload } from '../features/uploads';

/** A harbour wave over a board trace with three pads: the demo shop's own mark. */
const DEMO_LOGO_SVG = `<svg xmlns="http://www.w3.org/2000/svg" width="360" height="120" viewBox="0 0 360 120">
  <rect x="4" y="4" width="112" height="112" rx="18" fill="#0f5132"/>
  <path d="M14 70 C34 50 50 50 62 66 S94 84 106 62" stroke="#e9f5ee" stroke-width="9" fill="none" stroke-linecap="round"/>
  <path d="M24 96 H60 L74 82 H98" stroke="#f2c14e" stroke-width="5" fill="none"/>
  <circle cx="24" cy="96" r="7" fill="#f2c14e"/><circle cx="98" cy="82" r="7" fill="#f2c14e"/><circle cx="60" cy="28" r="9" fill="#e9f5ee"/>
  <rect x="136" y="30" width="210" height="18" rx="9" fill="#0f5132"/>
  <rect x="136" y="62" width="150" height="12" rx="6" fill="#6c8f7d"/>
  <rect x="136" y="86" width="180" height="12" rx="6" fill="#6c8f7d"/>
</svg>`;

/** Gives the shop the demo logo unless it already has one (the seed runs on every start). */
export async function seedDemoLogo(db: Db, storage: Storage, shopId: string, createdBy: string): Promise<void> {
  const [shop] = await db.select({ logo: shops.logoUploadId }).from(shops).where(eq(shops.id, shopId));
  if (!shop || shop.logo) return;
  const png = await sharp(Buffer.from(DEMO_LOGO_SVG)).png().toBuffer();
  const up = await storeUpload({ db, storage, shopId, createdBy, bytes: png, name: 'shop logo' });
  await db.update(shops).set({ logoUploadId: up.id }).where(eq(shops.id, shopId));
}
