import { useId, useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { PresetSummary, SessionSummary } from '../../../../shared/api/responses';
import { Button } from '../../../components/button';
import { LoadingBlock } from '../../../components/loading-block';
import { Notice } from '../../../components/notice';
import { useSessions } from '../../../lib/queries/get-sessions';
import { useLoadPresetIntoSession } from '../api/load-preset-into-session';
import { useStartSessionFromPreset } from '../../../lib/queries/start-session-from-preset';
import { LIMITS } from '../../../../shared/limits';
import { ActionPanel } from './action-panel';

export interface LoadIntoSessionPanelProps {
  studioId: string;
  preset: PresetSummary;
  onClose: () => void;
}

const linkClass = 'font-semibold text-brass-600 underline underline-offset-2 focus-visible:outline-2 focus-visible:outline-teal-400 dark:text-brass-400';

/** Picks one of the studio's open sessions and replaces its string with the preset's. */
export function LoadIntoSessionPanel({ studioId, preset, onClose }: LoadIntoSessionPanelProps) {
  const sessions = useSessions(studioId);
  const load = useLoadPresetIntoSession(studioId);
  const [sessionId, setSessionId] = useState('');
  const [choiceError, setChoiceError] = useState<string | undefined>();
  const [loadedInto, setLoadedInto] = useState<SessionSummary | null>(null);
  const [confirming, setConfirming] = useState<SessionSummary | null>(null);
  const start = useStartSessionFromPreset(studioId);
  const navigate = useNavigate();
  const selectId = useId();
  const open = sessions.data?.filter((session) => !session.archived) ?? [];

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const target = open.find((session) => session.id === sessionId);
    if (!target) {
      setChoiceError('Choose a session');
      return;
    }
    setChoiceError(undefined);
    // Asked first: the session's string changes for everyone in it.
    if (confirming?.id !== target.id) return setConfirming(target);
    load.mutate({ sessionId: target.id, input: { presetId: preset.id } }, { onSuccess: () => setLoadedInto(target) });
  };
  const startSession = () =>
    start.mutate({ presetId: preset.id, name: preset.name.slice(0, LIMITS.maxLabelLength) }, { onSuccess: (session) => navigate(`/sessions/${session.id}`) });

  return (
    <ActionPanel title={<>Load “{preset.name}” into a session</>} onClose={onClose} focusTitle={sessions.isPending || open.length === 0 || loadedInto !== null}>
      {loadedInto ? (
        <>
          <Notice tone="success" title="Preset loaded">
            “{preset.name}” now sounds in “{loadedInto.name}”.{' '}
            <Link to={`/sessions/${loadedInto.id}`} className={linkClass}>
              Open “{loadedInto.name}”
            </Link>
          </Notice>
          <div className="mt-3 flex justify-end">
            <Button variant="ghost" onClick={onClose}>
              Close
            </Button>
          </div>
        </>
      ) : sessions.isPending ? (
        <LoadingBlock label="Loading sessions…" rows={1} />
      ) : sessions.isError ? (
        <Notice tone="error" title="Cannot load the sessions">
          {sessions.error.message}
        </Notice>
      ) : open.length === 0 ? (
        <p className="text-sm">
          The studio has no open session.{' '}
          <Link to={`/studios/${studioId}`} className={linkClass}>
            Start one on the Sessions page
          </Link>
          , then come back.
        </p>
      ) : (
        <form onSubmit={submit} noValidate className="flex flex-wrap items-start gap-3">
          <div className="flex min-w-64 flex-1 flex-col gap-1">
            <label htmlFor={selectId} className="text-sm font-semibold text-slate-800 dark:text-slate-100">
              Session
            </label>
            <select
              id={selectId}
              value={sessionId}
              onChange={(event) => {
                setSessionId(event.target.value);
                setConfirming(null);
              }}
              aria-invalid={choiceError ? true : undefined}
              aria-describedby={`${selectId}-hint ${selectId}-error`}
              autoFocus
              className={`rounded-md border bg-white px-3 py-2 text-slate-900 shadow-sm outline-none focus-visible:ring-2 focus-visible:ring-teal-400 dark:bg-slate-900 dark:text-slate-100 ${
                choiceError ? 'border-ember-500' : 'border-slate-700/30 dark:border-slate-300/20'
              }`}
            >
              <option value="">Choose a session…</option>
              {open.map((session) => (
                <option key={session.id} value={session.id}>
                  {session.name}
                </option>
              ))}
            </select>
            <p id={`${selectId}-hint`} className="text-xs text-slate-600 dark:text-slate-300">
              The session&apos;s string, pluck and pickup are replaced for everyone in it; the preset stays as it is.
            </p>
            <p id={`${selectId}-error`} role={choiceError ? 'alert' : undefined} className="min-h-5 text-sm text-ember-600 dark:text-ember-400">
              {choiceError ?? ''}
            </p>
          </div>
          {confirming ? (
            <div role="group" aria-label={`Replace the string of “${confirming.name}”?`} className="mt-6 flex flex-wrap items-center gap-2">
              <span className="text-sm">Replace the string of “{confirming.name}” for everyone in it?</span>
              <Button type="submit" variant="danger" busy={load.isPending}>
                Yes, load it
              </Button>
              <Button variant="ghost" onClick={() => setConfirming(null)}>
                Cancel
              </Button>
            </div>
          ) : (
            <>
              <Button type="submit" className="mt-6" busy={load.isPending}>
                Load preset
              </Button>
              <Button variant="ghost" className="mt-6" onClick={onClose}>
                Cancel
              </Button>
            </>
          )}
        </form>
      )}
      {!loadedInto && (
        <div className="mt-3 flex flex-wrap items-center gap-2 border-t border-slate-700/15 pt-3 text-sm dark:border-slate-300/10">
          <span>Or start a session of its own:</span>
          <Button variant="secondary" busy={start.isPending} onClick={startSession}>
            New session from this preset
          </Button>
          {start.isError && <span className="text-ember-600 dark:text-ember-400">{start.error.message}</span>}
        </div>
      )}
      {load.isError && !loadedInto && (
        <div className="mt-3">
          <Notice tone="error">{load.error.message}</Notice>
        </div>
      )}
    </ActionPanel>
  );
}
