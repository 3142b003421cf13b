import { uploadSchema } from '@splitscope/contract';
import { api } from '@/lib/api-client';

/** Stores a board picture (PNG or JPEG bytes; the server checks the type from the bytes) and returns the upload. */
export const uploadPicture = (file: File) =>
  api(`/uploads?${new URLSearchParams({ name: file.name })}`, {
    method: 'POST',
    body: file,
    headers: { 'content-type': file.type || 'application/octet-stream' },
    schema: uploadSchema,
  });
