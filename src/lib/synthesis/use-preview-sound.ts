import { useEffect, useSyncExternalStore } from 'react';
import type { ComputeResult, SessionConnection } from '../live-session/session-connection';
import { useSynthesisClient } from './page-synthesis';
import type { PreviewSound } from './preview-sound';

/**
 * Hands each new mode table of the session to the page's synthesis worker the moment it arrives,
 * from the connection's own notification rather than after a render of the page, so synthesis
 * starts without waiting for React.
 */
export function useTableSynthesis(connection: SessionConnection): void {
  const client = useSynthesisClient();
  useEffect(() => {
    let submitted: ComputeResult | null = null;
    const submitLatest = () => {
      const { result } = connection.getSnapshot();
      if (!result || result === submitted) return;
      submitted = result;
      client.submit(result);
    };
    submitLatest();
    return connection.subscribe(submitLatest);
  }, [client, connection]);
}

/**
 * The preview of the latest mode table, synthesised from the table in the page's synthesis worker
 * and delivered progressively: the first 250 ms as soon as they exist (`readySamples` grows, then
 * `complete`), then the charts' data (`analysis`). Only the components that call this re-render as
 * chunks arrive. The page does no per-sample work.
 */
export function usePreviewSound(): PreviewSound | null {
  const client = useSynthesisClient();
  return useSyncExternalStore(client.subscribe, client.getSnapshot, client.getSnapshot);
}
