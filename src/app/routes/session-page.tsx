import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { Patch } from '../../../shared/patch/patch-schema';
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
import { usePreviewSound, useTableSynthesis } from '../../lib/synthesis/use-preview-sound';
import type { SessionConnection, SessionSnapshot } from '../../lib/live-session/session-connection';
import { sameFields, useSessionValue } from '../../lib/live-session/use-session-value';
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
 * The page's parts, memoised, and each reading only the part of the live session it shows
 * (`useSessionValue`): a compute result redraws the results only, a teammate's drag the canvas
 * (and a panel only when its own section changed), a preview's chunks the audition only.
 */
const Canvas = memo(StringCanvas);
const Handles = memo(HandleFields);
const Keys = memo(NoteKeyboard);
const Pluck = memo(PluckTool);
const StringFields = memo(StringPanel);
const LossFields = memo(LossesPanel);
const PickupFields = memo(PickupPanel);
const RenderFields = memo(RenderPanel);
const PresetControls = memo(SessionPresetControls);
const Plausibility = memo(PlausibilityNotice);
const Audition = memo(PreviewAudition);

/** Everyone's colour comes from their name, the same way on the server (which sets it in presence). */
const colourFor = presenceColour;

const selectPatch = (snapshot: SessionSnapshot) => snapshot.patch;
const selectPeers = (snapshot: SessionSnapshot) => snapshot.peers;
const selectResult = (snapshot: SessionSnapshot) => snapshot.result;
const selectResults = (snapshot: SessionSnapshot) => ({ result: snapshot.result, issues: snapshot.computeIssues });
const selectLengthM = (snapshot: SessionSnapshot) => snapshot.patch?.string.lengthM ?? null;
/** What the page's frame shows: it re-renders when one of these changes, not on each drag or result. */
const selectFrame = (snapshot: SessionSnapshot) => ({
  connection: snapshot.connection,
  hasPendingEdits: snapshot.hasPendingEdits,
  role: snapshot.role,
  readOnly: snapshot.readOnly,
  readOnlyReason: snapshot.readOnlyReason,
  notice: snapshot.notice,
  accessEnded: snapshot.accessEnded,
  canUndo: snapshot.canUndo,
  canRedo: snapshot.canRedo,
  patchIssues: snapshot.patchIssues,
  hasPatch: snapshot.patch !== null,
  hasStrike: Boolean(snapshot.patch?.excitation.velocityMPerS),
});
/** The people list shows names, roles and who drags: pointer moves do not change it. */
const samePeopleShown = (a: SessionSnapshot['peers'], b: SessionSnapshot['peers']) =>
  a.length === b.length && a.every((peer, index) => peer.clientId === b[index].clientId && peer.name === b[index].name && peer.colour === b[index].colour && peer.role === b[index].role && Boolean(peer.dragging) === Boolean(b[index].dragging));

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
  const name = me.data?.user.displayName ?? 'someone';
  const { connection, reopen } = useSessionConnection(sessionId, { name, colour: colourFor(name) });

  if (session.isError) {
    return (
      <Notice tone="error" title="Cannot open this session">
        {session.error.message}
      </Notice>
    );
  }
  if (!connection || !session.data) return <LoadingBlock label="Opening the session…" rows={6} />;
  return <Workbench connection={connection} sessionId={sessionId} name={name} reopen={reopen} />;
}

interface WorkbenchProps {
  connection: SessionConnection;
  sessionId: string;
  name: string;
  reopen: () => void;
}

function Workbench({ connection, sessionId, name, reopen }: WorkbenchProps) {
  const me = useMe();
  const session = useSession(sessionId);
  const presets = usePresets(session.data?.studioId ?? '');
  const frame = useSessionValue(connection, selectFrame, sameFields);
  const location = useLocation();
  const queryClient = useQueryClient();
  const endedReason = frame.accessEnded?.reason;
  const liveRole = frame.role;
  useEffect(() => {
    // Ask who is signed in, and in which studios with which roles, whenever the server changes either:
    // the header's studio list follows, and when signed out a 401 clears it and the signed-in layout
    // returns to sign-in (with ?next=).
    if (endedReason || liveRole) void queryClient.invalidateQueries({ queryKey: ['me'] });
  }, [endedReason, liveRole, queryClient]);
  const dark = useDarkTheme();
  const [selected, setSelected] = useState<CanvasSelection | null>(null);
  const [tool, setTool] = useState<'edit' | 'draw'>('edit');
  const [strokeProblem, setStrokeProblem] = useState<string | null>(null);
  const clearSelection = useCallback(() => setSelected(null), []);
  const [hoverMode, setHoverMode] = useState<number | null>(null);
  const [showStrike, setShowStrike] = useState(true);
  const [activeLayer, setActiveLayer] = useState<'displacement' | 'velocity'>('displacement');
  // Each table goes to the synthesis worker as it arrives, before any render.
  useTableSynthesis(connection);
  // Only when a test opened the page with its probe: stamps this page's edits and the tables it receives.
  useEffect(() => (auditionProbe ? auditionProbe.watchSession(connection) : undefined), [connection]);
  const comparisons = useMemo(() => (presets.data ?? []).map((preset) => ({ id: preset.id, name: preset.name, url: `/api/presets/${preset.id}/preview.wav` })), [presets.data]);

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if ((event.target as HTMLElement | null)?.closest('input, textarea, select')) return;
      const undo = (event.ctrlKey || event.metaKey) && event.key.toLowerCase() === 'z';
      if (undo && event.shiftKey) connection.redo();
      else if (undo) connection.undo();
      else return;
      event.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [connection]);

  const lowerTabs = useMemo(
    () => [
      { id: 'spectrum', label: 'Spectrum', render: () => <LiveChart connection={connection} chart={Spectrum} /> },
      { id: 'waveform', label: 'Waveform', render: () => <LiveChart connection={connection} chart={Waveform} /> },
      { id: 'motion', label: 'Slow motion', render: () => <LiveMotion connection={connection} dark={dark} /> },
      { id: 'notes', label: 'Notes', render: () => <LiveKeys connection={connection} /> },
    ],
    [connection, dark],
  );

  if (!session.data) return <LoadingBlock label="Opening the session…" rows={6} />;
  const { readOnly, hasPatch } = frame;

  const canvasPane = (
    <div className="flex h-full min-h-0 flex-col gap-2 overflow-y-auto">
      <ErrorBoundary title="The string canvas">
        <CanvasBox connection={connection} readOnly={readOnly} highlightMode={hoverMode} showStrike={showStrike} activeLayer={activeLayer} selected={selected} onSelect={setSelected} tool={tool} onStrokeProblem={setStrokeProblem} dark={dark} />
      </ErrorBoundary>
      <div className="flex shrink-0 flex-wrap items-center gap-x-6 gap-y-2">
        {hasPatch && (
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
            {frame.hasStrike ? (
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
          <LiveAudition comparisons={comparisons} />
        </ErrorBoundary>
      </div>
      {strokeProblem && <Notice tone="caution">{strokeProblem}</Notice>}
    </div>
  );

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
          <LiveModes connection={connection} onHoverMode={setHoverMode} />
        </ErrorBoundary>
      }
      second={<TabSet label="More views of the result" storageKey="tautline-workbench-tab" tabs={lowerTabs} className="h-full" />}
    />
  );

  const panelsPane = hasPatch ? (
    <div role="region" aria-label="Parameters" className="@container h-full overflow-y-auto pr-1">
      <div className="mb-2">
        <PresetControls
          connection={connection}
          studioId={session.data.studioId}
          sessionId={sessionId}
          sessionName={session.data.name}
          role={frame.role ?? me.data?.studios.find((studio) => studio.id === session.data.studioId)?.role}
          readOnly={readOnly}
          sourcePreset={session.data.sourcePreset ?? null}
          presets={presets.data ?? []}
        />
      </div>
      <LivePanels connection={connection} readOnly={readOnly} selected={selected} onDeleted={clearSelection} />
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
            <span className="size-2.5 rounded-full" style={{ background: colourFor(name) }} aria-hidden="true" /> {name} (you{frame.role && !frame.accessEnded ? `, ${frame.role}` : ''})
          </span>
          <PeopleHere connection={connection} />
        </section>
        <span role="status" className="shrink-0 whitespace-nowrap rounded-full bg-slate-700/10 px-3 py-1 text-sm dark:bg-slate-100/10" data-testid="connection-state">
          {connectionWords[frame.connection]}
          {frame.hasPendingEdits ? ' · edits waiting to sync' : ''}
        </span>
        <Button variant="secondary" onClick={() => connection.undo()} disabledReason={readOnly ? 'read-only' : frame.canUndo ? undefined : 'nothing of yours to undo'} aria-keyshortcuts="Control+Z">
          Undo
        </Button>
        <Button variant="secondary" onClick={() => connection.redo()} disabledReason={readOnly ? 'read-only' : frame.canRedo ? undefined : 'nothing to redo'} aria-keyshortcuts="Control+Shift+Z">
          Redo
        </Button>
      </header>

      <div className="max-h-[30%] shrink-0 overflow-y-auto empty:hidden">
        <LiveSessionNotice snapshot={frame} here={`${location.pathname}${location.search}`} studioHref={`/studios/${session.data.studioId}`} onReopen={reopen} />
        {frame.patchIssues.length > 0 && (
          <Notice tone="error" title="The string has a problem">
            <p>{frame.patchIssues.map((issue) => issue.message).join('; ')}</p>
            <p className="mt-2 flex flex-wrap gap-2">
              <Button variant="secondary" onClick={() => connection.undo()} disabledReason={readOnly ? 'read-only' : frame.canUndo ? undefined : 'nothing of yours to undo'}>
                Undo my last edit
              </Button>
              {hasPatch && (
                <Button
                  variant="secondary"
                  disabledReason={readOnly ? 'read-only' : undefined}
                  onClick={() => {
                    const { patch } = connection.getSnapshot();
                    if (patch) connection.edit((doc, origin) => writePatchToDoc(doc, patch, origin));
                  }}
                >
                  Restore the last valid string
                </Button>
              )}
            </p>
          </Notice>
        )}
      </div>

      <ResultFigures connection={connection} />

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

/** Teammates here, with their roles and who is dragging; redrawn when that changes, not as pointers move. */
const PeopleHere = memo(function PeopleHere({ connection }: { connection: SessionConnection }) {
  const peers = useSessionValue(connection, selectPeers, samePeopleShown);
  return peers.map((peer) => (
    <span key={peer.clientId} className="inline-flex shrink-0 items-center gap-1 whitespace-nowrap" data-testid="peer">
      <span className="size-2.5 rounded-full" style={{ background: peer.colour }} aria-hidden="true" /> {peer.name}
      {peer.role ? ` (${peer.role}${peer.dragging ? ', dragging' : ''})` : peer.dragging ? ' (dragging)' : ''}
    </span>
  ));
});

/** The latest result's headline figures, for screen readers (and the tests). */
const ResultFigures = memo(function ResultFigures({ connection }: { connection: SessionConnection }) {
  const result = useSessionValue(connection, selectResult);
  if (!result) return null;
  return (
    <p className="sr-only" data-testid="result-figures">
      f0 {result.f0Hz.toFixed(1)} Hz · {result.modeCount} modes · mode 1 level {result.energyJ[0] > 0 ? (10 * Math.log10(result.energyJ[0] / result.totalEnergyJ)).toFixed(2) : '—'} dB of the total energy
    </p>
  );
});

interface CanvasBoxProps {
  connection: SessionConnection;
  readOnly: boolean;
  highlightMode: number | null;
  showStrike: boolean;
  activeLayer: 'displacement' | 'velocity';
  selected: CanvasSelection | null;
  onSelect: (selection: CanvasSelection | null) => void;
  tool: 'edit' | 'draw';
  onStrokeProblem: (reason: string | null) => void;
  dark: boolean;
}

/** The canvas and its keyboard: follows the patch and everyone's pointers. */
const CanvasBox = memo(function CanvasBox({ connection, readOnly, highlightMode, showStrike, activeLayer, selected, onSelect, tool, onStrokeProblem, dark }: CanvasBoxProps) {
  const patch = useSessionValue(connection, selectPatch);
  const peers = useSessionValue(connection, selectPeers);
  const [canvasBox, canvasSize] = useElementSize<HTMLDivElement>({ widthPx: 800, heightPx: 300 });
  const rangeRef = useRef<number | null>(null);
  const peakM = patch ? Math.max(...patch.excitation.displacementM.map(([, y]) => Math.abs(y))) : 0;
  rangeRef.current = nextDisplayRangeM(rangeRef.current, peakM);
  const displayRangeM = rangeRef.current;
  return (
    <div
      ref={canvasBox}
      data-display-range-m={displayRangeM}
      tabIndex={0}
      onKeyDown={(event) => patch && canvasKey(event, { connection, patch, readOnly, selected, onSelect, showStrike })}
      aria-label="String canvas: drag points, click the line to add one, double-click a point to remove it; ] and [ select the next or previous handle, arrow keys move it, Delete removes it"
      className="min-h-0 flex-1 overflow-hidden rounded-lg border border-slate-700/15 focus-visible:outline-2 focus-visible:outline-teal-400 dark:border-slate-300/10"
      style={{ minHeight: MIN_CANVAS_HEIGHT_PX }}
    >
      {patch ? (
        <Canvas connection={connection} patch={patch} readOnly={readOnly} peers={peers} widthPx={canvasSize.widthPx} heightPx={Math.max(MIN_CANVAS_HEIGHT_PX, canvasSize.heightPx)} highlightMode={highlightMode} displayRangeM={displayRangeM} showStrike={showStrike} activeLayer={activeLayer} selected={selected} onSelect={onSelect} tool={tool} onStrokeProblem={onStrokeProblem} dark={dark} />
      ) : (
        <LoadingBlock label="Syncing the string…" rows={3} />
      )}
    </div>
  );
});

/**
 * The canvas from the keyboard: ] and [ step through the handles, arrow keys move the selected
 * one (1 mm along, 0.1 mm up or down; a tenth of that with Shift), Delete removes a point.
 */
function canvasKey(
  event: React.KeyboardEvent,
  { connection, patch, readOnly, selected, onSelect, showStrike }: { connection: SessionConnection; patch: Patch; readOnly: boolean; selected: CanvasSelection | null; onSelect: (selection: CanvasSelection | null) => void; showStrike: boolean },
): void {
  if (event.key === ']' || event.key === '[') {
    event.preventDefault();
    return onSelect(stepSelection(selected, selectionCounts(patch.excitation, showStrike), event.key === ']' ? 1 : -1));
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
      onSelect(null);
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
    onSelect(null);
    return void connection.edit((doc, origin) => void deletePoint(doc, layer, index, origin));
  }
  const [x, y] = (layer === 'displacement' ? patch.excitation.displacementM : patch.excitation.velocityMPerS)?.[index + 1] ?? [];
  if (x === undefined || y === undefined || (alongM === undefined && upDown === undefined)) return;
  event.preventDefault();
  // Up and down: 0.1 mm of displacement, or 0.01 m/s of velocity, per press.
  const valueStep = layer === 'displacement' ? 1e-4 : 1e-2;
  connection.edit((doc, origin) => void movePoint(doc, layer, index, x + ((alongM ?? 0) * fine) / 1000, y + (upDown ?? 0) * fine * valueStep, origin));
}

/** The preview's audition: the only part of the page that follows the preview's chunks as they arrive. */
function LiveAudition({ comparisons }: { comparisons: Array<{ id: string; name: string; url: string }> }) {
  const sound = usePreviewSound();
  return <Audition sound={sound} comparisons={comparisons} />;
}

/** The mode chart and headline figures: follow every result. */
const LiveModes = memo(function LiveModes({ connection, onHoverMode }: { connection: SessionConnection; onHoverMode: (mode: number | null) => void }) {
  const { result, issues } = useSessionValue(connection, selectResults, sameFields);
  return <ModesPane result={result} issues={issues} onHoverMode={onHoverMode} />;
});

/** The spectrum or the waveform: follow results and previews once they settle. */
function LiveChart({ connection, chart: Chart }: { connection: SessionConnection; chart: typeof Spectrum | typeof Waveform }) {
  const { result, issues } = useSessionValue(connection, selectResults, sameFields);
  const settledResult = useSettledValue(result);
  const settledSound = useSettledValue(usePreviewSound());
  // A preview's chunks re-render this wrapper only: the chart itself waits for the settled values.
  return useMemo(() => <Chart result={settledResult} sound={settledSound} issues={issues} fill />, [Chart, settledResult, settledSound, issues]);
}

function LiveMotion({ connection, dark }: { connection: SessionConnection; dark: boolean }) {
  const settledResult = useSettledValue(useSessionValue(connection, selectResult));
  const lengthM = useSessionValue(connection, selectLengthM);
  return lengthM !== null && settledResult ? (
    <ErrorBoundary title="Slow motion">
      <StringMotion result={settledResult} lengthM={lengthM} dark={dark} />
    </ErrorBoundary>
  ) : (
    <p className="p-2 text-sm text-slate-700 dark:text-slate-300">Slow motion appears when the first result arrives.</p>
  );
}

function LiveKeys({ connection }: { connection: SessionConnection }) {
  const patch = useSessionValue(connection, selectPatch);
  return patch ? <Keys patch={patch} /> : null;
}

/** The parameter panels: follow the patch; each memoised panel redraws only when its props change. */
const LivePanels = memo(function LivePanels({ connection, readOnly, selected, onDeleted }: { connection: SessionConnection; readOnly: boolean; selected: CanvasSelection | null; onDeleted: () => void }) {
  const patch = useSessionValue(connection, selectPatch);
  if (!patch) return null;
  return (
    <>
      <div className="mb-2">
        <Plausibility patch={patch} />
      </div>
      <div className="flex flex-col gap-2 @md:flex-row @md:items-start">
        <div className="flex min-w-0 flex-1 flex-col gap-2">
          <StringFields connection={connection} patch={patch} readOnly={readOnly} />
          <Pluck connection={connection} patch={patch} readOnly={readOnly} />
          <Handles connection={connection} patch={patch} selection={selected} readOnly={readOnly} onDeleted={onDeleted} />
        </div>
        <div className="flex min-w-0 flex-1 flex-col gap-2">
          <LossFields connection={connection} patch={patch} readOnly={readOnly} />
          <PickupFields connection={connection} patch={patch} readOnly={readOnly} />
          <RenderFields connection={connection} patch={patch} readOnly={readOnly} />
        </div>
      </div>
    </>
  );
});
