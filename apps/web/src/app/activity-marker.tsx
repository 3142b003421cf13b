import { useIsFetching, useIsMutating } from '@tanstack/react-query';
import { useEffect } from 'react';

/**
 * Marks the page with how many server requests are in flight (`<html data-requests="N">`), so a browser test can
 * wait until the screen has settled instead of sleeping for a guessed time; it renders nothing.
 */
export function ActivityMarker() {
  const pending = useIsFetching() + useIsMutating();
  useEffect(() => {
    document.documentElement.dataset.requests = String(pending);
  }, [pending]);
  return null;
}
