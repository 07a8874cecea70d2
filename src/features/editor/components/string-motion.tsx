import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type Konva from 'konva';
import { Layer, Line, Stage, Text } from 'react-konva';
import { modeAmplitudesAt, modeShapeTable, stringShapeM } from '../../../../shared/engine/modal-motion';
import type { ComputeResult } from '../../../lib/live-session/session-connection';
import { Button } from '../../../components/button';
import { COMPACT_CONTROL_CLASS } from '../../../components/compact-control';
import { useContainerWidth } from '../results/use-container-width';

/** Modes the animation sums: the shape a viewer can see needs far fewer than the sound. */
const MOTION_MODES = 128;
const MOTION_POINTS = 241;
const HEIGHT_PX = 150;
const MARGIN_PX = 36;

/** How much slower than life the motion plays. */
const SPEEDS = [
  { id: 'cycle', label: 'one cycle in 2 s' },
  { id: '1000', label: '1/1000 of real time' },
  { id: '10000', label: '1/10 000 of real time' },
] as const;
type SpeedId = (typeof SPEEDS)[number]['id'];

/** The string's shape as stage points: the width spread over the plot, heights scaled so peakM just fits. */
function linePoints(shape: Float64Array, peakM: number, widthPx: number): number[] {
  const drawable = widthPx - 2 * MARGIN_PX;
  const half = HEIGHT_PX / 2 - 12;
  const points = new Array<number>(MOTION_POINTS * 2);
  for (let j = 0; j < MOTION_POINTS; j++) {
    points[2 * j] = MARGIN_PX + (j / (MOTION_POINTS - 1)) * drawable;
    points[2 * j + 1] = HEIGHT_PX / 2 - (shape[j] / peakM) * half;
  }
  return points;
}

/**
 * The string's motion after release, built from the modes the server sent
 * (y(x, t) = Σ q_n(t) sin(nπx/L)), slowed down so the eye can follow the travelling kinks and
 * the decay. It draws on its own stage and updates one line per frame outside React, so it never
 * slows the editing canvas.
 */
export const StringMotion = memo(function StringMotion({ result, lengthM, dark }: { result: ComputeResult; lengthM: number; dark: boolean }) {
  const [boxRef, widthPx] = useContainerWidth<HTMLDivElement>();
  const [running, setRunning] = useState(false);
  const [speed, setSpeed] = useState<SpeedId>('cycle');
  const lineRef = useRef<Konva.Line>(null);
  const clockRef = useRef<Konva.Text>(null);
  const simTimeRef = useRef(0);

  const model = useMemo(() => {
    const count = Math.min(MOTION_MODES, result.modeCount);
    const xs = Float64Array.from({ length: MOTION_POINTS }, (_, j) => (lengthM * j) / (MOTION_POINTS - 1));
    const shapes = modeShapeTable(lengthM, count, xs);
    // The vertical scale: the largest excursion over the first period, so nothing leaves the stage.
    let peakM = 1e-9;
    const amplitudes = new Float64Array(count);
    const shape = new Float64Array(MOTION_POINTS);
    for (let s = 0; s < 32; s++) {
      stringShapeM(modeAmplitudesAt(result, count, s / (32 * result.f0Hz), amplitudes), shapes, MOTION_POINTS, shape);
      for (const y of shape) peakM = Math.max(peakM, Math.abs(y));
    }
    return { count, xs, shapes, peakM, amplitudes, shape };
  }, [result, lengthM]);

  // Drawing depends on the result, its model and the width; a new one restarts from the release.
  const draw = useCallback(
    (tS: number) => {
      stringShapeM(modeAmplitudesAt(result, model.count, tS, model.amplitudes), model.shapes, MOTION_POINTS, model.shape);
      lineRef.current?.points(linePoints(model.shape, model.peakM, widthPx));
      clockRef.current?.text(`t = ${(tS * 1000).toFixed(2)} ms after release`);
      lineRef.current?.getLayer()?.batchDraw();
    },
    [result, model, widthPx],
  );

  useEffect(() => {
    simTimeRef.current = 0;
    draw(0);
  }, [draw]);

  useEffect(() => {
    if (!running) return;
    const slowdown = speed === 'cycle' ? 2 * result.f0Hz : Number(speed);
    let last = performance.now();
    let frame = requestAnimationFrame(function step(now) {
      simTimeRef.current += (now - last) / 1000 / slowdown;
      last = now;
      // Start again once the tone has decayed to a trace (the preview's length is the horizon).
      if (simTimeRef.current > result.wire.preview.durationS) simTimeRef.current = 0;
      draw(simTimeRef.current);
      frame = requestAnimationFrame(step);
    });
    return () => cancelAnimationFrame(frame);
  }, [running, speed, result, draw]);

  const colours = dark ? { background: '#171b22', axis: '#323a4a', line: '#e8b64f', text: '#b7bfcc' } : { background: '#ffffff', axis: '#b7bfcc', line: '#a8741a', text: '#323a4a' };
  return (
    <section aria-label="Slow motion" className="rounded-lg border border-slate-700/15 p-3 dark:border-slate-300/10">
      <div className="mb-2 flex flex-wrap items-center gap-3">
        <h2 className="text-sm font-semibold">Slow motion</h2>
        <Button variant="secondary" onClick={() => setRunning((value) => !value)}>
          {running ? 'Pause' : 'Play motion'}
        </Button>
        <Button
          variant="secondary"
          onClick={() => {
            simTimeRef.current = 0;
            draw(0);
          }}
        >
          Back to release
        </Button>
        <label className="flex items-center gap-2 text-sm">
          Speed
          <select value={speed} onChange={(event) => setSpeed(event.target.value as SpeedId)} className={COMPACT_CONTROL_CLASS}>
            {SPEEDS.map((option) => (
              <option key={option.id} value={option.id}>
                {option.label}
              </option>
            ))}
          </select>
        </label>
        <span className="text-xs text-slate-600 dark:text-slate-300">
          From the first {model.count} modes, heights exaggerated (±{(model.peakM * 1000).toPrecision(2)} mm)
        </span>
      </div>
      <div ref={boxRef} data-testid="string-motion">
        <Stage width={widthPx} height={HEIGHT_PX}>
          <Layer listening={false}>
            <Line points={[0, 0, widthPx, 0, widthPx, HEIGHT_PX, 0, HEIGHT_PX]} closed fill={colours.background} />
            <Line points={[MARGIN_PX, HEIGHT_PX / 2, widthPx - MARGIN_PX, HEIGHT_PX / 2]} stroke={colours.axis} strokeWidth={1} />
            <Line ref={lineRef} points={linePoints(model.shape, model.peakM, widthPx)} stroke={colours.line} strokeWidth={2} />
            <Text ref={clockRef} x={MARGIN_PX} y={6} text="t = 0.00 ms after release" fontSize={11} fill={colours.text} />
          </Layer>
        </Stage>
      </div>
    </section>
  );
});
