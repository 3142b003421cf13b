// Small whole pictures for upload tests: uploads are decoded on arrival (a file that only starts like a PNG is
// refused as damaged), so tests send pictures an image library can read.
import sharp from 'sharp';

/** A 1×1 PNG. */
export const TINY_PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==', 'base64');

/** A 4×3 grey JPEG. */
export const tinyJpeg = (): Promise<Buffer> =>
  sharp({ create: { width: 4, height: 3, channels: 3, background: '#808080' } })
    .jpeg()
    .toBuffer();
