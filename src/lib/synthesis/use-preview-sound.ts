import { useEffect, useSyncExternalStore } from 'react';
import type { ComputeResult } from '../live-session/session-connection';
import { useSynthesisClient } from './page-synthesis';
import type { PreviewSound } from './preview-sound';

/**
 * The preview of the latest mode table, synthesised from the table in the page's synthesis worker
 * and delivered progressively: the first 250 ms as soon as they exist (`readySamples` grows, then
 * `complete`), then the charts' data (`analysis`). The page does no per-sample work.
 */
export function usePreviewSound(result: ComputeResult | null): PreviewSound | null {
  const client = useSynthesisClient();
  useEffect(() => {
    if (result) client.submit(result);
  }, [client, result]);
  const sound = useSyncExternalStore(client.subscribe, client.getSnapshot, client.getSnapshot);
  return result ? sound : null;
}
