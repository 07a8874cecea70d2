import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import type { RenderRefusedMessage } from '../../../../shared/protocol/render-protocol';
import { rendersQueryKey, type RenderList } from '../api/get-renders';
import { openRenderProgressChannel, type RenderChannelState } from '../api/render-progress-channel';
import { applyRenderProgress, isRenderFinished } from '../apply-render-progress';

/**
 * Follows the studio's render jobs while mounted. Each progress message updates every cached
 * list of the studio's renders in place; a job that finishes (done, failed, cancelled) or a new
 * job not yet listed makes the lists refetch, for its figures and the storage used.
 */
export function useRenderProgress(studioId: string): { state: RenderChannelState; refused: RenderRefusedMessage | null } {
  const queryClient = useQueryClient();
  const [status, setStatus] = useState<{ state: RenderChannelState; refused: RenderRefusedMessage | null }>({ state: 'connecting', refused: null });

  useEffect(() => {
    if (!studioId) return;
    const key = rendersQueryKey(studioId);
    const channel = openRenderProgressChannel({
      baseUrl: window.location.origin,
      studioId,
      onState: (state, refused) => setStatus({ state, refused }),
      onRejoined: () => void queryClient.invalidateQueries({ queryKey: key }),
      onProgress: (message) => {
        let listed = false;
        queryClient.setQueriesData<RenderList>({ queryKey: key }, (list) => {
          if (!list) return list;
          if (list.renders.some((render) => render.id === message.renderId)) listed = true;
          return applyRenderProgress(list, message);
        });
        // A teammate's new job shows up once, when queued; later messages of jobs a filtered list leaves out are ignored.
        if (isRenderFinished(message.state) || (!listed && message.state === 'queued')) void queryClient.invalidateQueries({ queryKey: key });
      },
    });
    return () => {
      channel.close();
      setStatus({ state: 'connecting', refused: null });
    };
  }, [studioId, queryClient]);

  return status;
}
