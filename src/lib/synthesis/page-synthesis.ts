import { useEffect } from 'react';
import { SynthesisClient, type SynthesisWorker } from './synthesis-client';

function startBrowserWorker(): SynthesisWorker {
  return new Worker(new URL('./synthesis-worker.ts', import.meta.url), { type: 'module', name: 'tautline-synthesis' }) as SynthesisWorker;
}

/**
 * The page's one synthesis client. Its worker starts on the first table or note and stops when the
 * last component holding the client (the session page's preview, its keys, its charts) unmounts.
 */
const pageClient = new SynthesisClient(startBrowserWorker);
let holders = 0;

/** The page's synthesis client, held while the calling component is mounted. */
export function useSynthesisClient(): SynthesisClient {
  useEffect(() => {
    holders++;
    return () => {
      holders--;
      if (holders === 0) pageClient.terminate();
    };
  }, []);
  return pageClient;
}

/** The page's client while some component holds it; null otherwise (nothing to ask). */
export function heldSynthesisClient(): SynthesisClient | null {
  return holders > 0 ? pageClient : null;
}
