// Phone photos arrive at several MB and 4000 px and more; screens and reports need far less. A picture larger than
// the bounds below is stored resized (longest side MAX_SIDE px, JPEG), turned upright from its EXIF orientation and
// with its metadata dropped (a phone photo's EXIF can hold the place it was taken). `sharp` (libvips) does the
// decoding and resizing: its prebuilt binary comes from the npm registry as an optional dependency.
import sharp, { type Metadata } from 'sharp';
import { AppError } from '../../http/errors';

/** Longest side of a stored picture, px: a board's markings stay readable when zoomed on a 1440 px screen. */
export const MAX_SIDE = 2400;
/** A picture at most this large (and within MAX_SIDE) is stored as sent. */
export const KEEP_BYTES = 1_500_000;
/** Beyond this many pixels a picture is refused before decoding (a decompression bomb, not a photo). */
const MAX_PIXELS = 100_000_000;

export interface FittedPicture {
  bytes: Buffer;
  type: 'image/png' | 'image/jpeg';
  width: number;
  height: number;
}

export async function fitPicture(bytes: Buffer, type: 'image/png' | 'image/jpeg'): Promise<FittedPicture> {
  let meta: Metadata;
  try {
    meta = await sharp(bytes, { limitInputPixels: MAX_PIXELS }).metadata();
  } catch {
    throw new AppError('unsupported_media_type', 'The picture could not be read: the file looks damaged or is not a whole PNG or JPEG');
  }
  const { width = 0, height = 0 } = meta;
  if (!width || !height) throw new AppError('unsupported_media_type', 'The picture could not be read: it has no size');
  // EXIF orientations 5–8 swap width and height once the picture is turned upright.
  const upright = (meta.orientation ?? 1) >= 5 ? { width: height, height: width } : { width, height };
  const turned = (meta.orientation ?? 1) > 1;
  if (bytes.length <= KEEP_BYTES && Math.max(width, height) <= MAX_SIDE && !turned) return { bytes, type, width, height };
  try {
    const { data, info } = await sharp(bytes, { limitInputPixels: MAX_PIXELS })
      .rotate()
      .resize({ width: MAX_SIDE, height: MAX_SIDE, fit: 'inside', withoutEnlargement: true })
      .flatten({ background: '#ffffff' })
      .jpeg({ quality: 82 })
      .toBuffer({ resolveWithObject: true });
    return { bytes: data, type: 'image/jpeg', width: info.width || upright.width, height: info.height || upright.height };
  } catch {
    throw new AppError('unsupported_media_type', 'The picture could not be read: the file looks damaged or is not a whole PNG or JPEG');
  }
}
