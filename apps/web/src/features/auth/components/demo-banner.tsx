import { useSetupStatus } from '@/lib/api/setup-status';

/** On every page of the demo, so nobody mistakes it for a shop's real data. */
export function DemoBanner() {
  const status = useSetupStatus();
  if (status.data?.mode !== 'demo') return null;
  return (
    <div role="note" className="no-print bg-amber-300 px-4 py-1 text-center text-sm font-semibold text-ink">
      Demo shop — invented data
    </div>
  );
}
