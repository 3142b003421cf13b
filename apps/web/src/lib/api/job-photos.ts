import { uploadListResponse, uploadRefusalListResponse, uploadSchema } from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

const jobPath = (jobId: string) => `/jobs/${encodeURIComponent(jobId)}`;

export const getJobPhotosQueryOptions = (jobId: string) =>
  queryOptions({ queryKey: ['jobs', jobId, 'photos'], queryFn: () => api(`${jobPath(jobId)}/uploads`, { schema: uploadListResponse }) });
export const useJobPhotos = (jobId: string) => useQuery(getJobPhotosQueryOptions(jobId));

export const getPhotoRefusalsQueryOptions = (jobId: string) =>
  queryOptions({ queryKey: ['jobs', jobId, 'photo-refusals'], queryFn: () => api(`${jobPath(jobId)}/upload-refusals`, { schema: uploadRefusalListResponse }) });
export const usePhotoRefusals = (jobId: string) => useQuery(getPhotoRefusalsQueryOptions(jobId));

/** One picture's raw bytes for a job; the server checks the type from the bytes and resizes a large photo. */
export const uploadJobPhoto = (file: File, jobId: string) => {
  const qs = new URLSearchParams({ name: file.name.slice(0, 200), jobId });
  return api(`/uploads?${qs}`, { method: 'POST', body: file, headers: { 'content-type': file.type || 'application/octet-stream' }, schema: uploadSchema });
};

/** Sends the pictures one by one; a refused one is recorded on the job by the server, the rest still go. */
export function useAddJobPhotos(jobId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (files: File[]) => {
      const failed: { name: string; message: string }[] = [];
      for (const f of files) {
        try {
          await uploadJobPhoto(f, jobId);
        } catch (err) {
          failed.push({ name: f.name, message: (err as Error).message });
        }
      }
      return { failed };
    },
    onSettled: () =>
      Promise.all([qc.invalidateQueries({ queryKey: ['jobs', jobId, 'photos'] }), qc.invalidateQueries({ queryKey: ['jobs', jobId, 'photo-refusals'] })]),
  });
}
