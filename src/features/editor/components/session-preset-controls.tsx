import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import type { SourcePresetRef } from '../../../../shared/api/responses';
import { ACTION_REASONS, can, type Role } from '../../../../shared/access/roles';
import { writePatchToDoc } from '../../../../shared/collab/patch-doc';
import { LIMITS } from '../../../../shared/limits';
import { Button } from '../../../components/button';
import { COMPACT_CONTROL_CLASS } from '../../../components/compact-control';
import { Notice } from '../../../components/notice';
import { ApiRequestError } from '../../../lib/api-error';
import type { SessionConnection } from '../../../lib/live-session/session-connection';
import { useAnnouncePresetLoaded } from '../api/announce-preset-loaded';
import { fetchPresetPatch } from '../api/fetch-preset-patch';
import { useSaveSessionAsPreset } from '../api/save-session-as-preset';
import { useStartSessionFromPreset } from '../../../lib/queries/start-session-from-preset';
import { useUpdateSourcePreset } from '../api/update-source-preset';
import { SavePresetDialog } from './save-preset-dialog';

export interface SessionPresetControlsProps {
  connection: SessionConnection;
  studioId: string;
  sessionId: string;
  sessionName: string;
  /** The caller's role in the studio (the live role once the session has joined). */
  role: Role | undefined;
  readOnly: boolean;
  /** The preset this session came from, if it still exists. */
  sourcePreset: SourcePresetRef | null;
  /** The studio's presets, to load one or start a new session from it. */
  presets: ReadonlyArray<{ id: string; name: string }>;
}

type Outcome = { tone: 'info' | 'error'; message: string } | null;

function problemOf(error: unknown): string {
  return error instanceof Error ? error.message : 'Something went wrong';
}

/**
 * The session's presets, from the editor: Save as preset and Update preset (leads), Load a preset
 * into this session (asks first; one undo step; everyone present is told) and New session from a
 * preset (leads and designers). A control someone may not use stays visible, disabled, with the reason.
 */
export function SessionPresetControls({ connection, studioId, sessionId, sessionName, role, readOnly, sourcePreset, presets }: SessionPresetControlsProps) {
  const navigate = useNavigate();
  const [saving, setSaving] = useState(false);
  const [choosing, setChoosing] = useState(false);
  const [chosenId, setChosenId] = useState('');
  const [confirming, setConfirming] = useState(false);
  const [loading, setLoading] = useState(false);
  const [outcome, setOutcome] = useState<Outcome>(null);
  const save = useSaveSessionAsPreset(studioId, sessionId);
  const update = useUpdateSourcePreset(studioId, sessionId);
  const announce = useAnnouncePresetLoaded(sessionId);
  const start = useStartSessionFromPreset(studioId);

  const presetReason = role && can(role, 'managePresets') ? undefined : ACTION_REASONS.managePresets;
  const editReason = role && can(role, 'editSessions') ? undefined : ACTION_REASONS.editSessions;
  const chosen = presets.find((preset) => preset.id === chosenId);
  const serverErrors = save.error instanceof ApiRequestError ? Object.fromEntries(save.error.issues.map((issue) => [issue.field, issue.problem.charAt(0).toUpperCase() + issue.problem.slice(1)])) : {};
  const saveProblem = save.error && Object.keys(serverErrors).length === 0 ? problemOf(save.error) : undefined;

  const loadIntoSession = async () => {
    if (!chosen) return;
    setLoading(true);
    try {
      const preset = await fetchPresetPatch(chosen.id);
      // One edit of the live document, kept apart from the edits before and after: one Undo takes it back.
      connection.beginGesture();
      const applied = connection.edit((doc, origin) => writePatchToDoc(doc, structuredClone(preset.patch), origin));
      connection.endGesture();
      if (!applied) throw new Error('The session is read-only or not connected yet: nothing was loaded');
      await announce.mutateAsync(preset.id);
      setOutcome({ tone: 'info', message: `Loaded “${preset.name}”. Everyone here was told; Undo takes it back.` });
      setChoosing(false);
      setConfirming(false);
    } catch (error) {
      setOutcome({ tone: 'error', message: problemOf(error) });
    } finally {
      setLoading(false);
    }
  };

  const startFromPreset = () => {
    if (!chosen) return;
    const name = chosen.name.slice(0, LIMITS.maxLabelLength);
    start.mutate(
      { presetId: chosen.id, name },
      { onSuccess: (session) => navigate(`/sessions/${session.id}`), onError: (error) => setOutcome({ tone: 'error', message: problemOf(error) }) },
    );
  };

  return (
    <section aria-label="Presets" className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-2">
        <Button
          variant="secondary"
          disabledReason={presetReason}
          onClick={() => {
            save.reset();
            setOutcome(null);
            setSaving(true);
          }}
        >
          Save as preset…
        </Button>
        {sourcePreset && (
          <Button
            variant="secondary"
            busy={update.isPending}
            disabledReason={presetReason}
            aria-label={`Update preset “${sourcePreset.name}”`}
            title={`Writes this session's string to “${sourcePreset.name}” (version ${sourcePreset.version}); the version rises only if the sound changed`}
            onClick={() =>
              update.mutate(undefined, {
                onSuccess: (result) =>
                  setOutcome({
                    tone: 'info',
                    message: result.changed ? `Updated “${result.preset.name}”: now version ${result.preset.version}.` : `“${result.preset.name}” already sounds like this session: still version ${result.preset.version}.`,
                  }),
                onError: (error) => setOutcome({ tone: 'error', message: problemOf(error) }),
              })
            }
          >
            <span className="max-w-40 truncate">Update “{sourcePreset.name}”</span>
          </Button>
        )}
        <Button
          variant="secondary"
          disabledReason={editReason}
          aria-expanded={choosing}
          onClick={() => {
            setOutcome(null);
            setConfirming(false);
            setChoosing(!choosing);
          }}
        >
          From a preset…
        </Button>
      </div>

      {choosing && (
        <div role="group" aria-label="Use a preset" className="flex flex-wrap items-center gap-2 rounded-lg border border-slate-700/15 p-3 text-sm dark:border-slate-300/10">
          <label className="flex items-center gap-2">
            Preset
            <select
              aria-label="Preset"
              value={chosenId}
              onChange={(event) => {
                setChosenId(event.target.value);
                setConfirming(false);
              }}
              className={COMPACT_CONTROL_CLASS}
            >
              <option value="">Choose a preset…</option>
              {presets.map((preset) => (
                <option key={preset.id} value={preset.id}>
                  {preset.name}
                </option>
              ))}
            </select>
          </label>
          {confirming && chosen ? (
            <span role="group" aria-label={`Replace this session's string with “${chosen.name}”?`} className="flex flex-wrap items-center gap-2">
              <span>Replace this session's string with “{chosen.name}”? Everyone here sees it at once; Undo takes it back.</span>
              <Button variant="danger" busy={loading} onClick={() => void loadIntoSession()}>
                Yes, load it
              </Button>
              <Button variant="ghost" disabled={loading} onClick={() => setConfirming(false)}>
                Cancel
              </Button>
            </span>
          ) : (
            <>
              <Button variant="secondary" disabledReason={!chosen ? 'choose a preset first' : readOnly ? 'this session is read-only for you' : editReason} onClick={() => setConfirming(true)}>
                Load into this session…
              </Button>
              <Button variant="secondary" busy={start.isPending} disabledReason={!chosen ? 'choose a preset first' : editReason} onClick={startFromPreset}>
                New session from it
              </Button>
            </>
          )}
        </div>
      )}

      {saving && (
        <SavePresetDialog
          sessionId={sessionId}
          defaultName={sessionName}
          busy={save.isPending}
          serverErrors={serverErrors}
          problem={saveProblem}
          onCancel={() => setSaving(false)}
          onSave={(input) =>
            save.mutate(input, {
              onSuccess: (preset) => {
                setSaving(false);
                setOutcome({ tone: 'info', message: `Saved “${preset.name}” to the library (version ${preset.version}).` });
              },
            })
          }
        />
      )}

      {outcome && (
        <div data-testid="preset-outcome" role="status">
          <Notice tone={outcome.tone}>{outcome.message}</Notice>
        </div>
      )}
    </section>
  );
}
