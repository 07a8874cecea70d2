import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Link, useLocation, useParams } from 'react-router-dom';
import { writePatchToDoc } from '../../../shared/collab/patch-doc';
import { presenceColour } from '../../../shared/collab/presence-colour';
import { deletePoint, movePoint } from '../../../shared/collab/point-edits';
import { Button } from '../../components/button';
import { COMPACT_CONTROL_CLASS } from '../../components/compact-control';
import { ErrorBoundary } from '../../components/error-boundary';
import { LoadingBlock } from '../../components/loading-block';
import { Notice } from '../../components/notice';
import { SegmentedChoice } from '../../components/segmented-choice';
import { SplitPane } from '../../components/split-pane';
import { TabSet } from '../../components/tab-set';
import { useDarkTheme } from '../../components/use-dark-theme';
import { useElementSize } from '../../components/use-element-size';
import { useMe } from '../../lib/queries/get-me';
import { LiveSessionNotice } from '../../features/collab/components/live-session-notice';
import { useSessionConnection } from '../../features/collab/hooks/use-session-connection';
import { LossesPanel, PickupPanel, RenderPanel, StringPanel } from '../../features/editor/components/patch-panels';
import { HandleFields } from '../../features/editor/components/handle-fields';
import { NoteKeyboard } from '../../features/editor/components/note-keyboard';
import { PluckTool } from '../../features/editor/components/pluck-tool';
import { PreviewAudition } from '../../features/editor/components/preview-audition';
import { usePreviewSound } from '../../lib/synthesis/use-preview-sound';
import { auditionProbe } from '../../lib/audio/audition-probe';
import { PlausibilityNotice } from '../../features/editor/components/plausibility-notice';
import { SessionPresetControls } from '../../features/editor/components/session-preset-controls';
import { nextDisplayRangeM, StringCanvas } from '../../features/editor/components/string-canvas';
import { StringMotion } from '../../features/editor/components/string-motion';
import { selectionCounts, stepSelection, type CanvasSelection } from '../../features/editor/geometry/canvas-selection';
import { partKeyChanges } from '../../features/editor/geometry/part-key-step';
import { removeExcitationPart, updateExcitationPart } from '../../../shared/collab/excitation-part-edits';
import { ModesPane } from '../../features/editor/results/results-panel';
import { Spectrum } from '../../features/editor/results/spectrum';
import { Waveform } from '../../features/editor/results/waveform';
import { useSettledValue } from '../../features/editor/results/use-settled-value';
import { usePresets } from '../../features/presets/api/get-presets';
import { useSession } from '../../lib/queries/get-session';
import { addStrikeLayer, movePickup } from '../../../shared/collab/pickup-position-edit';

/**
 * The page's parts, memoised: a compute result (about five a second while people drag) redraws the
 * results only, and a teammate's drag redraws the canvas and the panels only.
 */
const Canvas = memo(StringCanvas);
const Handles = memo(HandleFields);
const Keys = memo(NoteKeyboard);
const Pluck = memo(PluckTool);
const StringFields = memo(StringPanel);
const LossFields = memo(LossesPanel);
const PickupFields = memo(PickupPanel);
const RenderFields = memo(RenderPanel);

/** Everyone's colour comes from their name, the same way on the server (which sets it in presence). */
const colourFor = presenceColour;

const connectionWords = { connecting: 'Connecting…', connected: 'Connected', reconnecting: 'Reconnecting…', offline: 'Offline' } as const;

/** The canvas is never drawn shorter than this; below it the canvas pane scrolls. */
const MIN_CANVAS_HEIGHT_PX = 140;

/**
 * The live session editor: one string, shaped by several people at once, heard as it changes.
 * A workbench that fits one screen: the canvas with its tools and the playback controls over the
 * mode chart and a set of tabs (spectrum, waveform, slow motion, notes) on the left, the parameter
 * panels on the right; the dividers are dragged (or moved with the arrow keys) and remembered on
 * this device, and each pane scrolls inside itself, never the page.
 */
export default function SessionPage() {
  const { sessionId = '' } = useParams();
  const me = useMe();
  const session = useSession(sessionId);
  const presets = usePresets(session.data?.studioId ?? '');
  const name = me.data?.user.displayName ?? 'someone';
  const { connection, snapshot, reopen } = useSessionConnection(sessionId, { name, colour: colourFor(name) });
  const location = useLocation();
  const queryClient = useQueryClient();
  const endedReason = snapshot?.accessEnded?.reason;
  const liveRole = snapshot?.role;
  useEffect(() => {
    // Ask who is signed in, and in which studios with which roles, whenever the server changes either:
    // the header's studio list follows, and when signed out a 401 clears it and the signed-in layout
    // returns to sign-in (with ?next=).
    if (endedReason || liveRole) void queryClient.invalidateQueries({ queryKey: ['me'] });
  }, [endedReason, liveRole, queryClient]);
  const [canvasBox, canvasSize] = useElementSize<HTMLDivElement>({ widthPx: 800, heightPx: 300 });
  const dark = useDarkTheme();
  const [selected, setSelected] = useState<CanvasSelection | null>(null);
  const [tool, setTool] = useState<'edit' | 'draw'>('edit');
  const [strokeProblem, setStrokeProblem] = useState<string | null>(null);
  const clearSelection = useCallback(() => setSelected(null), []);
  const [hoverMode, setHoverMode] = useState<number | null>(null);
  const [showStrike, setShowStrike] = useState(true);
  const [activeLayer, setActiveLayer] = useState<'displacement' | 'velocity'>('displacement');
  const rangeRef = useRef<number | null>(null);
  const settledResult = useSettledValue(snapshot?.result ?? null);
  const sound = usePreviewSound(snapshot?.result ?? null);
  const settledSound = useSettledValue(sound);
  // Only when a test opened the page with its probe: stamps this page's edits and the tables it receives.
  useEffect(() => (connection && auditionProbe ? auditionProbe.watchSession(connection) : undefined), [connection]);
  const comparisons = useMemo(() => (presets.data ?? []).map((preset) => ({ id: preset.id, name: preset.name, url: `/api/presets/${preset.id}/preview.wav` })), [presets.data]);

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (!connection || (event.target as HTMLElement | null)?.closest('input, textarea, select')) return;
      const undo = (event.ctrlKey || event.metaKey) && event.key.toLowerCase() === 'z';
      if (undo && event.shiftKey) connection.redo();
      else if (undo) connection.undo();
      else return;
      event.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [connection]);

  if (session.isError) {
    return (
      <Notice tone="error" title="Cannot open this session">
        {session.error.message}
      </Notice>
    );
  }
  if (!connection || !snapshot || !session.data) return <LoadingBlock label="Opening the session…" rows={6} />;
  const { patch, readOnly } = snapshot;
  const peakM = patch ? Math.max(...patch.excitation.displacementM.map(([, y]) => Math.abs(y))) : 0;
  rangeRef.current = nextDisplayRangeM(rangeRef.current, peakM);
  const displayRangeM = rangeRef.current;

  /**
   * The canvas from the keyboard: ] and [ step through the handles, arrow keys move the selected
   * one (1 mm along, 0.1 mm up or down; a tenth of that with Shift), Delete removes a point.
   */
  const onCanvasKey = (event: React.KeyboardEvent) => {
    if (!patch) return;
    if (event.key === ']' || event.key === '[') {
      event.preventDefault();
      return setSelected(stepSelection(selected, selectionCounts(patch.excitation, showStrike), event.key === ']' ? 1 : -1));
    }
    if (!selected || readOnly) return;
    const fine = event.shiftKey ? 0.1 : 1;
    const alongM = { ArrowLeft: -1, ArrowRight: 1 }[event.key as string];
    const upDown = { ArrowUp: 1, ArrowDown: -1 }[event.key as string];
    if (selected.layer === 'pickup') {
      if (alongM === undefined) return;
      event.preventDefault();
      return void connection.edit((doc, origin) => movePickup(doc, patch.pickup.positionM + (alongM * fine) / 1000, origin));
    }
    if (selected.layer === 'part') {
      const partIndex = selected.index;
      if (event.key === 'Delete' || event.key === 'Backspace') {
        event.preventDefault();
        setSelected(null);
        return void connection.edit((doc, origin) => void removeExcitationPart(doc, partIndex, origin));
      }
      const part = patch.excitation.parts?.[partIndex];
      const changes = part ? partKeyChanges(part, event.key, event.shiftKey) : null;
      if (!changes) return;
      event.preventDefault();
      return void connection.edit((doc, origin) => void updateExcitationPart(doc, partIndex, changes, origin));
    }
    const { layer, index } = selected;
    if (event.key === 'Delete' || event.key === 'Backspace') {
      event.preventDefault();
      setSelected(null);
      return void connection.edit((doc, origin) => void deletePoint(doc, layer, index, origin));
    }
    const [x, y] = (layer === 'displacement' ? patch.excitation.displacementM : patch.excitation.velocityMPerS)?.[index + 1] ?? [];
    if (x === undefined || y === undefined || (alongM === undefined && upDown === undefined)) return;
    event.preventDefault();
    // Up and down: 0.1 mm of displacement, or 0.01 m/s of velocity, per press.
    const valueStep = layer === 'displacement' ? 1e-4 : 1e-2;
    connection.edit((doc, origin) => void movePoint(doc, layer, index, x + ((alongM ?? 0) * fine) / 1000, y + (upDown ?? 0) * fine * valueStep, origin));
  };

  const canvasPane = (
    <div className="flex h-full min-h-0 flex-col gap-2 overflow-y-auto">
      <ErrorBoundary title="The string canvas">
        <div
          ref={canvasBox}
          data-display-range-m={displayRangeM}
          tabIndex={0}
          onKeyDown={onCanvasKey}
          aria-label="String canvas: drag points, click the line to add one, double-click a point to remove it; ] and [ select the next or previous handle, arrow keys move it, Delete removes it"
          className="min-h-0 flex-1 overflow-hidden rounded-lg border border-slate-700/15 focus-visible:outline-2 focus-visible:outline-teal-400 dark:border-slate-300/10"
          style={{ minHeight: MIN_CANVAS_HEIGHT_PX }}
        >
          {patch ? (
            <Canvas connection={connection} patch={patch} readOnly={readOnly} peers={snapshot.peers} widthPx={canvasSize.widthPx} heightPx={Math.max(MIN_CANVAS_HEIGHT_PX, canvasSize.heightPx)} highlightMode={hoverMode} displayRangeM={displayRangeM} showStrike={showStrike} activeLayer={activeLayer} selected={selected} onSelect={setSelected} tool={tool} onStrokeProblem={setStrokeProblem} dark={dark} />
          ) : (
            <LoadingBlock label="Syncing the string…" rows={3} />
          )}
        </div>
      </ErrorBoundary>
      <div className="flex shrink-0 flex-wrap items-center gap-x-6 gap-y-2">
        {patch && (
          <section aria-label="Layers" className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm">
            <SegmentedChoice
              label="Canvas tool"
              value={tool}
              onChange={setTool}
              options={[
                { value: 'edit', label: 'Edit points' },
                { value: 'draw', label: 'Draw freehand', disabled: readOnly },
              ]}
            />
            {patch.excitation.velocityMPerS ? (
              <>
                <label className="flex items-center gap-2">
                  <input type="checkbox" checked={showStrike} onChange={(event) => setShowStrike(event.target.checked)} className="size-4 accent-teal-600" />
                  Show the strike layer (initial velocity)
                </label>
                <label className="flex items-center gap-2">
                  Clicking the line adds to
                  <select value={activeLayer} onChange={(event) => setActiveLayer(event.target.value as 'displacement' | 'velocity')} className={COMPACT_CONTROL_CLASS}>
                    <option value="displacement">the shape (displacement)</option>
                    <option value="velocity">the strike layer (velocity)</option>
                  </select>
                </label>
              </>
            ) : (
              <Button variant="secondary" disabledReason={readOnly ? 'read-only' : undefined} onClick={() => connection.edit((doc, origin) => addStrikeLayer(doc, origin))}>
                Add a strike layer
              </Button>
            )}
          </section>
        )}
        <ErrorBoundary title="Audition">
          <PreviewAudition sound={sound} comparisons={comparisons} />
        </ErrorBoundary>
      </div>
      {strokeProblem && <Notice tone="caution">{strokeProblem}</Notice>}
    </div>
  );

  const lowerTabs = [
    { id: 'spectrum', label: 'Spectrum', render: () => <Spectrum result={settledResult} sound={settledSound} issues={snapshot.computeIssues} fill /> },
    { id: 'waveform', label: 'Waveform', render: () => <Waveform result={settledResult} sound={settledSound} issues={snapshot.computeIssues} fill /> },
    {
      id: 'motion',
      label: 'Slow motion',
      render: () =>
        patch && settledResult ? (
          <ErrorBoundary title="Slow motion">
            <StringMotion result={settledResult} lengthM={patch.string.lengthM} dark={dark} />
          </ErrorBoundary>
        ) : (
          <p className="p-2 text-sm text-slate-700 dark:text-slate-300">Slow motion appears when the first result arrives.</p>
        ),
    },
    { id: 'notes', label: 'Notes', render: () => (patch ? <Keys patch={patch} /> : null) },
  ];

  const chartsPane = (
    <SplitPane
      id="workbench-charts"
      direction="row"
      defaultFraction={0.5}
      minFraction={0.25}
      maxFraction={0.75}
      label="Resize the mode chart and the tabs beside it"
      className="h-full"
      first={
        <ErrorBoundary title="The results">
          <ModesPane result={snapshot.result} issues={snapshot.computeIssues} onHoverMode={setHoverMode} />
        </ErrorBoundary>
      }
      second={<TabSet label="More views of the result" storageKey="tautline-workbench-tab" tabs={lowerTabs} className="h-full" />}
    />
  );

  const panelsPane = patch ? (
    <div role="region" aria-label="Parameters" className="@container h-full overflow-y-auto pr-1">
      <div className="mb-2">
        <SessionPresetControls
          connection={connection}
          studioId={session.data.studioId}
          sessionId={sessionId}
          sessionName={session.data.name}
          role={snapshot.role ?? me.data?.studios.find((studio) => studio.id === session.data.studioId)?.role}
          readOnly={readOnly}
          sourcePreset={session.data.sourcePreset ?? null}
          presets={presets.data ?? []}
        />
      </div>
      <div className="mb-2">
        <PlausibilityNotice patch={patch} />
      </div>
      <div className="flex flex-col gap-2 @md:flex-row @md:items-start">
        <div className="flex min-w-0 flex-1 flex-col gap-2">
          <StringFields connection={connection} patch={patch} readOnly={readOnly} />
          <Pluck connection={connection} patch={patch} readOnly={readOnly} />
          <Handles connection={connection} patch={patch} selection={selected} readOnly={readOnly} onDeleted={clearSelection} />
        </div>
        <div className="flex min-w-0 flex-1 flex-col gap-2">
          <LossFields connection={connection} patch={patch} readOnly={readOnly} />
          <PickupFields connection={connection} patch={patch} readOnly={readOnly} />
          <RenderFields connection={connection} patch={patch} readOnly={readOnly} />
        </div>
      </div>
    </div>
  ) : (
    <LoadingBlock label="Syncing the string…" rows={4} />
  );

  return (
    <div className="flex h-full min-h-0 flex-col gap-2">
      <header className="flex min-w-0 shrink-0 flex-nowrap items-center gap-3">
        <div className="flex min-w-0 shrink items-baseline gap-3">
          <h1 className="truncate text-lg font-semibold" title={session.data.name}>
            {session.data.name}
          </h1>
          <Link className="shrink-0 whitespace-nowrap text-sm underline" to={`/studios/${session.data.studioId}`}>
            Back to the sessions
          </Link>
        </div>
        <section aria-label="People here" className="flex min-w-0 flex-1 items-center gap-2 overflow-x-auto text-sm [scrollbar-width:thin]">
          <span className="font-semibold">Here:</span>
          <span className="inline-flex shrink-0 items-center gap-1 whitespace-nowrap">
            <span className="size-2.5 rounded-full" style={{ background: colourFor(name) }} aria-hidden="true" /> {name} (you{snapshot.role && !snapshot.accessEnded ? `, ${snapshot.role}` : ''})
          </span>
          {snapshot.peers.map((peer) => (
            <span key={peer.clientId} className="inline-flex shrink-0 items-center gap-1 whitespace-nowrap" data-testid="peer">
              <span className="size-2.5 rounded-full" style={{ background: peer.colour }} aria-hidden="true" /> {peer.name}
              {peer.role ? ` (${peer.role}${peer.dragging ? ', dragging' : ''})` : peer.dragging ? ' (dragging)' : ''}
            </span>
          ))}
        </section>
        <span role="status" className="shrink-0 whitespace-nowrap rounded-full bg-slate-700/10 px-3 py-1 text-sm dark:bg-slate-100/10" data-testid="connection-state">
          {connectionWords[snapshot.connection]}
          {snapshot.hasPendingEdits ? ' · edits waiting to sync' : ''}
        </span>
        <Button variant="secondary" onClick={() => connection.undo()} disabledReason={readOnly ? 'read-only' : snapshot.canUndo ? undefined : 'nothing of yours to undo'} aria-keyshortcuts="Control+Z">
          Undo
        </Button>
        <Button variant="secondary" onClick={() => connection.redo()} disabledReason={readOnly ? 'read-only' : snapshot.canRedo ? undefined : 'nothing to redo'} aria-keyshortcuts="Control+Shift+Z">
          Redo
        </Button>
      </header>

      <div className="max-h-[30%] shrink-0 overflow-y-auto empty:hidden">
        <LiveSessionNotice snapshot={snapshot} here={`${location.pathname}${location.search}`} studioHref={`/studios/${session.data.studioId}`} onReopen={reopen} />
        {snapshot.patchIssues.length > 0 && (
          <Notice tone="error" title="The string has a problem">
            <p>{snapshot.patchIssues.map((issue) => issue.message).join('; ')}</p>
            <p className="mt-2 flex flex-wrap gap-2">
              <Button variant="secondary" onClick={() => connection.undo()} disabledReason={readOnly ? 'read-only' : snapshot.canUndo ? undefined : 'nothing of yours to undo'}>
                Undo my last edit
              </Button>
              {patch && (
                <Button variant="secondary" disabledReason={readOnly ? 'read-only' : undefined} onClick={() => connection.edit((doc, origin) => writePatchToDoc(doc, patch, origin))}>
                  Restore the last valid string
                </Button>
              )}
            </p>
          </Notice>
        )}
      </div>

      {snapshot.result && (
        <p className="sr-only" data-testid="result-figures">
          f0 {snapshot.result.f0Hz.toFixed(1)} Hz · {snapshot.result.modeCount} modes · mode 1 level{' '}
          {snapshot.result.energyJ[0] > 0 ? (10 * Math.log10(snapshot.result.energyJ[0] / snapshot.result.totalEnergyJ)).toFixed(2) : '—'} dB of the total energy
        </p>
      )}

      <SplitPane
        id="workbench-columns"
        direction="row"
        defaultFraction={0.6}
        minFraction={0.35}
        maxFraction={0.78}
        label="Resize the canvas and the parameter panels"
        className="min-h-0 flex-1"
        first={<SplitPane id="workbench-left" direction="column" defaultFraction={0.52} minFraction={0.3} maxFraction={0.8} label="Resize the canvas and the charts" className="h-full" first={canvasPane} second={chartsPane} />}
        second={panelsPane}
      />
    </div>
  );
}
