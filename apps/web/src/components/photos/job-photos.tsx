import { useState } from 'react';
import type { Upload } from '@splitscope/contract';
import { useAddJobPhotos, useJobPhotos, usePhotoRefusals } from '@/lib/api/job-photos';

const mb = (n: number) => `${(n / 1_000_000).toFixed(1)} MB`;
const sizeText = (u: Upload) =>
  [u.width && u.height ? `${u.width}×${u.height}` : null, u.originalSize ? `stored ${mb(u.size)} (sent ${mb(u.originalSize)})` : mb(u.size)]
    .filter(Boolean)
    .join(' · ');

/**
 * The job's photos: a gallery (each opens full size), the pictures that were sent and not stored with the reason,
 * and, where the user may add, a picker that sends more. A refused picture is said here, on the job, never on a
 * form that would invite opening the job again.
 */
export function JobPhotos({ jobId, canAdd = false, compact = false }: { jobId: string; canAdd?: boolean; compact?: boolean }) {
  const photos = useJobPhotos(jobId);
  const refusals = usePhotoRefusals(jobId);
  const add = useAddJobPhotos(jobId);
  const [lastFailed, setLastFailed] = useState<{ name: string; message: string }[]>([]);
  const items = photos.data?.items ?? [];
  const refused = refusals.data?.items ?? [];
  return (
    <section aria-labelledby={`photos-${jobId}`} className="text-sm">
      <h2 id={`photos-${jobId}`} className="mb-1 text-base font-semibold">
        Photos ({items.length})
      </h2>
      {photos.isError && <p role="alert">The photos could not be loaded: {photos.error.message}</p>}
      {items.length === 0 && photos.isSuccess && <p className="text-stone-700">No photo of this board yet.</p>}
      <ul className={`grid gap-2 ${compact ? 'grid-cols-3' : 'grid-cols-2 sm:grid-cols-4'}`}>
        {items.map((u) => (
          <li key={u.id} className="rounded-md border border-stone-300 bg-white p-1">
            <a href={u.url} target="_blank" rel="noreferrer" className="block">
              <img src={u.url} alt={u.name ? `Photo ${u.name}` : 'Board photo'} loading="lazy" className="aspect-[4/3] w-full rounded object-cover" />
            </a>
            <span className="mt-1 block truncate text-xs text-stone-700" title={u.name ?? undefined}>
              {u.name ?? 'photo'} · {sizeText(u)}
            </span>
          </li>
        ))}
      </ul>
      {refused.length > 0 && (
        <div role="status" className="mt-2 rounded-md border border-amber-600 bg-amber-50 p-2" data-testid="photo-refusals">
          <p className="font-semibold">Not stored ({refused.length}):</p>
          <ul className="list-disc pl-5">
            {refused.map((r) => (
              <li key={r.id}>
                {r.name ?? 'a picture'} ({mb(r.size)}): {r.reason}
              </li>
            ))}
          </ul>
          {canAdd && <p className="mt-1">Take or pick the photo again (PNG or JPEG) and add it below.</p>}
        </div>
      )}
      {lastFailed.length > 0 && refused.length === 0 && (
        <p role="alert" className="mt-2 rounded-md bg-red-50 p-2 text-high">
          {lastFailed.map((f) => `${f.name}: ${f.message}`).join('; ')}
        </p>
      )}
      {canAdd && (
        <label className="mt-2 block">
          <span className="font-medium">Add photos (PNG or JPEG, phone photos are resized)</span>
          <input
            type="file"
            accept="image/png,image/jpeg"
            multiple
            disabled={add.isPending}
            className="mt-1 block min-h-11 w-full"
            onChange={(ev) => {
              const files = Array.from(ev.target.files ?? []);
              ev.target.value = '';
              if (files.length) void add.mutateAsync(files).then((r) => setLastFailed(r.failed));
            }}
          />
          {add.isPending && <span className="text-stone-700">Sending…</span>}
        </label>
      )}
    </section>
  );
}
