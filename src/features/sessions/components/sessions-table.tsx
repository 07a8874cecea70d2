import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { SessionSummary } from '../../../../shared/api/responses';
import { ACTION_REASONS } from '../../../../shared/access/roles';
import { Button } from '../../../components/button';
import { ConfirmAction } from '../../../components/confirm-action';
import { DataTable, type Column } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';

export interface SessionsTableProps {
  sessions: SessionSummary[];
  canEdit: boolean;
  onRename: (session: SessionSummary) => void;
  onArchive: (session: SessionSummary, archived: boolean) => void;
  /** A copy of the session, "… (copy)"; the button shows only when given. */
  onDuplicate?: (session: SessionSummary) => void;
  /** The session being copied right now. */
  duplicatingId?: string;
  busyId?: string;
  /** Who is in each session now, by session id. */
  presence?: Record<string, Array<{ id: string; displayName: string | null }>>;
}

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** The studio's sessions: searchable by name, sortable by name, last edit and editor. */
export function SessionsTable({ sessions, canEdit, onRename, onArchive, onDuplicate, duplicatingId, busyId, presence = {} }: SessionsTableProps) {
  const [query, setQuery] = useState('');
  const shown = useMemo(() => {
    const needle = query.trim().toLowerCase();
    return needle ? sessions.filter((session) => session.name.toLowerCase().includes(needle)) : sessions;
  }, [sessions, query]);
  const reason = canEdit ? undefined : ACTION_REASONS.editSessions;

  const columns: Column<SessionSummary>[] = [
    {
      key: 'name',
      header: 'Session',
      sortValue: (session) => session.name.toLowerCase(),
      render: (session) => (
        <Link to={`/sessions/${session.id}`} className="font-semibold text-slate-900 underline-offset-2 hover:underline focus-visible:outline-2 focus-visible:outline-teal-400 dark:text-slate-100">
          {session.name}
          {session.archived && <span className="ml-2 rounded bg-slate-700/10 px-1.5 py-0.5 text-xs font-normal dark:bg-slate-100/10">archived</span>}
        </Link>
      ),
    },
    { key: 'updatedAt', header: 'Last edited', sortValue: (session) => Date.parse(session.updatedAt), render: (session) => dateTime.format(new Date(session.updatedAt)) },
    { key: 'updatedBy', header: 'By', sortValue: (session) => session.updatedBy?.displayName ?? '', render: (session) => session.updatedBy?.displayName ?? '—' },
    {
      key: 'here',
      header: 'Here now',
      sortValue: (session) => presence[session.id]?.length ?? 0,
      render: (session) => {
        const people = presence[session.id] ?? [];
        return people.length === 0 ? (
          <span className="text-slate-600 dark:text-slate-300">—</span>
        ) : (
          <span className="inline-flex items-center gap-1.5">
            <span className="size-2 rounded-full bg-teal-400" aria-hidden="true" />
            {people.map((person) => person.displayName ?? 'someone').join(', ')}
          </span>
        );
      },
    },
    {
      key: 'actions',
      header: 'Actions',
      className: 'text-right',
      render: (session) => (
        <div className="flex justify-end gap-2">
          <Button variant="secondary" disabledReason={reason} onClick={() => onRename(session)} aria-label={`Rename ${session.name}`}>
            Rename
          </Button>
          {onDuplicate && (
            <Button variant="secondary" disabledReason={reason} busy={duplicatingId === session.id} onClick={() => onDuplicate(session)} aria-label={`Duplicate ${session.name}`} title="A new session with a copy of this one's string">
              Duplicate
            </Button>
          )}
          {session.archived ? (
            <Button variant="ghost" disabledReason={reason} busy={busyId === session.id} onClick={() => onArchive(session, false)} aria-label={`Restore ${session.name}`}>
              Restore
            </Button>
          ) : (
            <ConfirmAction
              label="Archive"
              ariaLabel={`Archive ${session.name}`}
              question={`Archive ${session.name}? It leaves the studio's list; Restore brings it back.`}
              confirmLabel="Yes, archive"
              showQuestion
              busy={busyId === session.id}
              disabledReason={reason}
              onConfirm={() => onArchive(session, true)}
            />
          )}
        </div>
      ),
    },
  ];

  return (
    <div className="flex flex-col gap-3">
      <label className="flex max-w-sm flex-col gap-1 text-sm font-semibold">
        Search sessions
        <input
          type="search"
          value={query}
          onChange={(event) => setQuery(event.target.value)}
          className="rounded-md border border-slate-700/30 bg-white px-3 py-2 font-normal dark:border-slate-300/20 dark:bg-slate-900"
          placeholder="Name contains…"
        />
      </label>
      {shown.length === 0 ? (
        <EmptyState title={sessions.length === 0 ? 'No sessions yet' : 'No session matches'}>
          {sessions.length === 0 ? (canEdit ? 'Start one to shape a string with your team.' : 'A lead or designer can start one.') : 'Try another name.'}
        </EmptyState>
      ) : (
        <DataTable caption="Sessions of this studio" rows={shown} columns={columns} rowKey={(session) => session.id} initialSort={{ key: 'updatedAt', direction: 'descending' }} />
      )}
    </div>
  );
}
