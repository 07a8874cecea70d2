import { useState } from 'react';
import { useParams } from 'react-router-dom';
import { can } from '../../../shared/access/roles';
import { EmptyState } from '../../components/empty-state';
import { LoadingBlock } from '../../components/loading-block';
import { Notice } from '../../components/notice';
import { PageHeader } from '../../components/page-header';
import { useMe } from '../../lib/queries/get-me';
import { usePresets } from '../../features/presets/api/get-presets';
import { useCancelRender } from '../../features/renders/api/cancel-render';
import { useDeleteRender } from '../../features/renders/api/delete-render';
import { useRenders } from '../../features/renders/api/get-renders';
import { NewRenderForm } from '../../features/renders/components/new-render-form';
import { RendersTable } from '../../features/renders/components/renders-table';
import { StorageUsage } from '../../features/renders/components/storage-usage';
import { useRenderProgress } from '../../features/renders/hooks/use-render-progress';
import { useSessions } from '../../lib/queries/get-sessions';
import NotFoundPage from './not-found-page';

const LOADING_ROWS = 4;

const controlClass =
  'rounded-md border border-slate-700/30 bg-white px-3 py-2 font-normal text-slate-900 focus-visible:outline-2 focus-visible:outline-teal-400 dark:border-slate-300/20 dark:bg-slate-900 dark:text-slate-100';

const CHANNEL_WORDS = {
  connecting: 'Connecting for live progress…',
  live: 'Progress updates live.',
  offline: 'Live progress is offline; the list refreshes every few seconds while a render runs.',
  refused: 'Live progress was refused; the list refreshes every few seconds while a render runs.',
} as const;

/** A studio's renders: start one (leads, producers), follow its progress, play, download, cancel and delete. */
export default function RendersPage() {
  const { studioId = '' } = useParams();
  const me = useMe();
  const studio = me.data?.studios.find((candidate) => candidate.id === studioId);
  const [sessionFilter, setSessionFilter] = useState('');
  // Archived sessions stay in the filter, since their renders remain; only open ones are offered as sources.
  const sessions = useSessions(studioId, true);
  const presets = usePresets(studioId);
  const channel = useRenderProgress(studioId);
  const renders = useRenders(studioId, { sessionId: sessionFilter || undefined }, { pollWhileActive: channel.state !== 'live' && channel.state !== 'connecting' });
  const cancel = useCancelRender(studioId);
  const remove = useDeleteRender(studioId);

  if (me.isPending) return <LoadingBlock label="Loading the studio…" rows={LOADING_ROWS} />;
  if (!studio) return <NotFoundPage />;
  const canExport = can(studio.role, 'exportRenders');
  const canDelete = can(studio.role, 'deleteRenders');
  const allSessions = sessions.data ?? [];
  const openSessions = allSessions.filter((session) => !session.archived);
  const actionError = cancel.error ?? remove.error;
  const busyId = cancel.isPending ? cancel.variables : remove.isPending ? remove.variables : undefined;

  return (
    <>
      <PageHeader title="Renders" subtitle={`${studio.name} · WAV files and note sets made from the studio's sessions and presets`} actions={renders.data && <StorageUsage storage={renders.data.storage} />} />
      <NewRenderForm studioId={studioId} canExport={canExport} sessions={openSessions} presets={presets.data ?? []} />

      <div className="mb-3 flex flex-wrap items-end gap-3">
        <h2 className="mr-auto text-lg font-semibold">Renders</h2>
        <label className="flex min-w-56 flex-col gap-1 text-sm font-semibold">
          Session
          <select value={sessionFilter} onChange={(event) => setSessionFilter(event.target.value)} className={controlClass}>
            <option value="">All sessions and presets</option>
            {allSessions.map((session) => (
              <option key={session.id} value={session.id}>
                {session.name}
                {session.archived ? ' (archived)' : ''}
              </option>
            ))}
          </select>
        </label>
      </div>
      <p className="mb-3 min-h-5 text-xs text-slate-600 dark:text-slate-300">{CHANNEL_WORDS[channel.state]}</p>

      {actionError && (
        <div className="mb-4">
          <Notice tone="error">{actionError.message}</Notice>
        </div>
      )}

      {renders.isPending ? (
        <LoadingBlock label="Loading renders…" rows={LOADING_ROWS} />
      ) : renders.isError ? (
        <Notice tone="error" title="Cannot load the renders">
          {renders.error.message}
        </Notice>
      ) : renders.data.renders.length === 0 ? (
        <EmptyState title={sessionFilter ? 'No renders of this session yet' : 'No renders yet'}>
          {canExport ? 'Choose a session or preset above and start a render; its progress shows here.' : 'A lead or producer can render the studio’s sessions and presets; they will show here.'}
        </EmptyState>
      ) : (
        <RendersTable
          renders={renders.data.renders}
          canExport={canExport}
          canDelete={canDelete}
          busyId={busyId}
          onCancel={(render) => {
            remove.reset();
            cancel.mutate(render.id);
          }}
          onDelete={(render) => {
            cancel.reset();
            remove.mutate(render.id);
          }}
        />
      )}
    </>
  );
}
