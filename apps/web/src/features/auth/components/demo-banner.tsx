import { useEffect } from 'react';
import { useSetupStatus } from '@/lib/api/setup-status';

// The banner's height, also published as --banner-h so full-height screens (the bench) leave room for it.
const HEIGHT = '1.75rem';

/** On every page of the demo, so nobody mistakes it for a shop's real data. */
export function DemoBanner() {
  const status = useSetupStatus();
  const shown = status.data?.mode === 'demo';
  useEffect(() => {
    if (!shown) return;
    document.documentElement.style.setProperty('--banner-h', HEIGHT);
    return () => {
      document.documentElement.style.removeProperty('--banner-h');
    };
  }, [shown]);
  if (!shown) return null;
  return (
    <div role="note" style={{ height: HEIGHT }} className="no-print flex items-center justify-center bg-amber-300 px-4 text-sm font-semibold text-ink">
      Demo shop — invented data
    </div>
  );
}
