import { uploadSchema } from '@splitscope/contract';
import { api } from '@/lib/api-client';

/** Uploads one picture's raw bytes; the server checks the type from the bytes. */
export const uploadPhoto = (file: File, jobId?: string) => {
  const qs = new URLSearchParams({ name: file.name, ...(jobId ? { jobId } : {}) });
  return api(`/uploads?${qs}`, { method: 'POST', body: file, headers: { 'content-type': file.type || 'application/octet-stream' }, schema: uploadSchema });
};
