import { useState, type FormEvent } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { SessionSummary } from '../../../shared/api/responses';
import { ACTION_REASONS, can } from '../../../shared/access/roles';
import { Button } from '../../components/button';
import { LoadingBlock } from '../../components/loading-block';
import { Notice } from '../../components/notice';
import { PageHeader } from '../../components/page-header';
import { TextField } from '../../components/text-field';
import { useMe } from '../../lib/queries/get-me';
import { createSessionInputSchema, useCreateSession } from '../../features/sessions/api/create-session';
import { useSessions } from '../../lib/queries/get-sessions';
import { useSessionPresence } from '../../features/sessions/api/get-session-presence';
import { updateSessionInputSchema, useUpdateSession } from '../../features/sessions/api/update-session';
import { SessionsTable } from '../../features/sessions/components/sessions-table';
import { useDuplicateSession } from '../../features/sessions/api/duplicate-session';
import { useFieldErrors } from '../../lib/use-field-errors';
import NotFoundPage from './not-found-page';

/** A studio's home: its sessions, and starting, renaming and archiving them as the role allows. */
export default function StudioHomePage() {
  const { studioId = '' } = useParams();
  const me = useMe();
  const studio = me.data?.studios.find((candidate) => candidate.id === studioId);
  const [showArchived, setShowArchived] = useState(false);
  const sessions = useSessions(studioId, showArchived);
  const presence = useSessionPresence(studioId);
  const create = useCreateSession(studioId);
  const update = useUpdateSession(studioId);
  const duplicate = useDuplicateSession(studioId);
  const createFields = useFieldErrors();
  const renameFields = useFieldErrors();
  const [newName, setNewName] = useState('');
  const [renaming, setRenaming] = useState<{ session: SessionSummary; name: string } | null>(null);

  if (!studio) return <NotFoundPage />;
  const canEdit = can(studio.role, 'editSessions');

  const submitCreate = (event: FormEvent) => {
    event.preventDefault();
    const input = createFields.check(createSessionInputSchema, { name: newName });
    if (!input) return;
    create.mutate(input, { onSuccess: () => setNewName(''), onError: createFields.fromServer });
  };
  const submitRename = (event: FormEvent) => {
    event.preventDefault();
    if (!renaming) return;
    const input = renameFields.check(updateSessionInputSchema, { name: renaming.name });
    if (!input) return;
    update.mutate({ sessionId: renaming.session.id, input }, { onSuccess: () => setRenaming(null), onError: renameFields.fromServer });
  };

  return (
    <>
      <PageHeader title={studio.name} subtitle={`Sessions · you are ${studio.role === 'lead' ? 'a lead' : `a ${studio.role}`} here`} />
      <section aria-labelledby="new-session" className="mb-8 rounded-lg border border-slate-700/15 p-4 dark:border-slate-300/10">
        <h2 id="new-session" className="font-semibold">
          Start a session
        </h2>
        <form onSubmit={submitCreate} noValidate className="mt-3 flex flex-wrap items-start gap-3">
          <TextField className="min-w-64 flex-1" label="Session name" value={newName} onChange={(event) => setNewName(event.target.value)} error={createFields.errors.name} disabled={!canEdit} />
          <Button type="submit" className="mt-6" busy={create.isPending} disabledReason={canEdit ? undefined : ACTION_REASONS.editSessions}>
            Start session
          </Button>
        </form>
        {create.isError && !createFields.errors.name && <Notice tone="error">{create.error.message}</Notice>}
      </section>

      {renaming && (
        <section aria-labelledby="rename-session" className="mb-6 rounded-lg border border-brass-500/40 p-4">
          <h2 id="rename-session" className="font-semibold">
            Rename “{renaming.session.name}”
          </h2>
          <form onSubmit={submitRename} noValidate className="mt-3 flex flex-wrap items-start gap-3">
            <TextField className="min-w-64 flex-1" label="New name" value={renaming.name} onChange={(event) => setRenaming({ ...renaming, name: event.target.value })} error={renameFields.errors.name} autoFocus />
            <Button type="submit" className="mt-6" busy={update.isPending}>
              Save name
            </Button>
            <Button variant="ghost" className="mt-6" onClick={() => setRenaming(null)}>
              Cancel
            </Button>
          </form>
        </section>
      )}

      <div className="mb-3 flex items-center justify-between">
        <h2 className="text-lg font-semibold">Sessions</h2>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={showArchived} onChange={(event) => setShowArchived(event.target.checked)} className="size-4 accent-brass-500" />
          Show archived
        </label>
      </div>
      {update.isError && !renaming && <Notice tone="error">{update.error.message}</Notice>}
      {duplicate.isError && <Notice tone="error">{duplicate.error.message}</Notice>}
      {duplicate.isSuccess && (
        <div role="status" className="mb-3">
          <Notice tone="info">
            Copied as{' '}
            <Link className="underline" to={`/sessions/${duplicate.data.id}`}>
              {duplicate.data.name}
            </Link>
          </Notice>
        </div>
      )}
      {sessions.isPending ? (
        <LoadingBlock label="Loading sessions…" />
      ) : sessions.isError ? (
        <Notice tone="error" title="Cannot load the sessions">
          {sessions.error.message}
        </Notice>
      ) : (
        <SessionsTable
          sessions={sessions.data}
          presence={presence.data}
          canEdit={canEdit}
          busyId={update.isPending ? update.variables?.sessionId : undefined}
          onRename={(session) => setRenaming({ session, name: session.name })}
          onArchive={(session, archived) => update.mutate({ sessionId: session.id, input: { archived } })}
          onDuplicate={(session) => duplicate.mutate(session.id)}
          duplicatingId={duplicate.isPending ? duplicate.variables : undefined}
        />
      )}
    </>
  );
}
