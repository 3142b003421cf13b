import { uploadSchema } from '@splitscope/contract';
import { api } from '@/lib/api-client';

/** Stores a board picture (PNG or JPEG bytes; the server checks the type from the bytes) and returns the upload. */
export const uploadPicture = (file: File) =>
  api(`/uploads?${new URLSearchParams({ name: file.name })}`, { method: 'POST', body: file, headers: { 'content-type': file.type || 'application/octet-stream' }, schema: uploadSchema });

/** A picture's size in pixels, read by the browser, so points placed on it keep their places. */
export function imageSize(url: string): Promise<{ width: number; height: number }> {
  return new Promise((resolve, reject) => {
    const img = new Image();
    img.onload = () => resolve({ width: img.naturalWidth, height: img.naturalHeight });
    img.onerror = () => reject(new Error('The picture could not be read'));
    img.src = url;
  });
}
