import { uploadSchema } from '@splitscope/contract';
import { api } from '@/lib/api-client';

/** The picture's bytes as they are (PNG or JPEG; the server checks the contents). */
export const uploadLogo = (file: File) =>
  api(`/uploads?name=${encodeURIComponent(file.name.slice(0, 200))}`, {
    method: 'POST',
    body: file,
    headers: { 'content-type': file.type || 'application/octet-stream' },
    schema: uploadSchema,
  });
