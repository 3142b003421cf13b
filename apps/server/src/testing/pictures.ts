// Small whole pictures made in code, for the fuzzer's uploads: uploads are decoded on arrival, so a payload that
// only starts like a PNG is refused, and a route that takes a picture is reached only with a real one.
import sharp from 'sharp';

/** A picture of a random size (8–127 × 6–95 px) and colour, PNG or JPEG, chosen by `seed` in [0, 1). */
export async function smallPicture(seed: number): Promise<{ bytes: Buffer; type: 'image/png' | 'image/jpeg'; width: number; height: number }> {
  const width = 8 + Math.floor(seed * 120);
  const height = 6 + Math.floor(((seed * 7919) % 1) * 90);
  const img = sharp({ create: { width, height, channels: 3, background: { r: Math.floor(seed * 255), g: 120, b: 60 } } });
  return seed < 0.5
    ? { bytes: await img.png().toBuffer(), type: 'image/png', width, height }
    : { bytes: await img.jpeg().toBuffer(), type: 'image/jpeg', width, height };
}
