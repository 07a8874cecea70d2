import { useMemo, useRef } from 'react';
import type Konva from 'konva';
import { Circle, Group, Layer, Line, Rect, Stage, Text } from 'react-konva';
import { deletePoint, insertPoint, movePoint, replaceLayerPoints } from '../../../../shared/collab/point-edits';
import type { Patch } from '../../../../shared/patch/patch-schema';
import type { Presence, SessionConnection } from '../../../lib/live-session/session-connection';
import { createCanvasScale } from '../geometry/canvas-scale';
import { asPixels, type PixelPoint } from '../geometry/canvas-units';
import { sameSelection, type CanvasSelection } from '../geometry/canvas-selection';
import { polylineFromStroke } from '../geometry/freehand';
import { niceTicks } from '../geometry/nice-ticks';
import { movePickup } from '../../../../shared/collab/pickup-position-edit';
import { updateExcitationPart, type PartChanges } from '../../../../shared/collab/excitation-part-edits';
import { layerMadeByPartsReason } from '../../../../shared/collab/point-edits';
import { PART_LAYER, partOrdinal, partsMakeLayer } from '../../../../shared/patch/excitation-part';

export interface StringCanvasProps {
  connection: SessionConnection;
  patch: Patch;
  readOnly: boolean;
  peers: Array<Presence & { clientId: number }>;
  widthPx: number;
  heightPx: number;
  /** Mode whose shape is drawn over the string (hovered in the mode chart). */
  highlightMode: number | null;
  /** Displacement drawn at the top edge of the drawing area, metres (vertical exaggeration). */
  displayRangeM: number;
  selected: CanvasSelection | null;
  onSelect: (selection: CanvasSelection | null) => void;
  /** 'edit' drags and adds points; 'draw' replaces the active layer with a freehand stroke. */
  tool: 'edit' | 'draw';
  /** Called with the reason when a stroke cannot become a shape, and with null when it did. */
  onStrokeProblem: (reason: string | null) => void;
  /** Whether the strike layer (initial velocity) is drawn, and which layer a click on the line adds to. */
  showStrike: boolean;
  activeLayer: 'displacement' | 'velocity';
  dark: boolean;
}

export const CANVAS_MARGIN_PX = 36;
const COLOURS = {
  dark: { axis: '#323a4a', string: '#e8b64f', point: '#f2cf7e', text: '#b7bfcc', pickup: '#4cc7b8', mode: '#ef8566' },
  light: { axis: '#b7bfcc', string: '#a8741a', point: '#d49a2a', text: '#323a4a', pickup: '#1f8f82', mode: '#c24b2b' },
};
/** The freehand stroke's points while no stroke is drawn: one array, so a render does not touch the line. */
const NO_POINTS: number[] = [];
/** How far outside a contact's edge its width grip is drawn, so a narrow contact's grips stay clear of the handle's ring. */
const EDGE_GRIP_PX = 16;
const MARGIN_PX = CANVAS_MARGIN_PX;

/**
 * The string between its supports, true length along the axis (with a millimetre scale), the
 * initial displacement exaggerated vertically. Points drag (clamped between their neighbours by
 * the shared edit helpers); a click on the line adds a point; the pickup is a handle on the axis.
 * Teammates' pointers and the points they drag show in their colours.
 */
export function StringCanvas({ connection, patch, readOnly, peers, widthPx, heightPx, highlightMode, displayRangeM, selected, onSelect, tool, onStrokeProblem, showStrike, activeLayer, dark }: StringCanvasProps) {
  const lengthM = patch.string.lengthM;
  const points = patch.excitation.displacementM;
  const peakM = Math.max(1e-3, ...points.map(([, y]) => Math.abs(y)));
  const midPx = heightPx / 2;
  // The tested mapping of the geometry module; Konva hands back plain numbers, marked as pixels here.
  const scale = useMemo(() => {
    const mapping = createCanvasScale({ lengthM, widthPx, heightPx, marginPx: MARGIN_PX, displacementRangeM: displayRangeM });
    return {
      xToPx: (xM: number) => mapping.xToPx(xM),
      pxToX: (px: number) => mapping.pxToX(asPixels(px)),
      yToPx: (yM: number) => mapping.yToPx(yM),
      pxToY: (px: number) => mapping.pxToY(asPixels(px)),
    };
  }, [widthPx, heightPx, lengthM, displayRangeM]);

  const colours = dark ? COLOURS.dark : COLOURS.light;

  // Kept while the shape is the same object (the connection keeps unchanged parts), so a teammate's pointer moving does not redraw the string.
  const flat = useMemo(() => points.flatMap(([x, y]) => [scale.xToPx(x), scale.yToPx(y)]), [points, scale]);
  // The strike layer (initial velocity) has its own vertical scale, drawn over the same axis.
  const strike = patch.excitation.velocityMPerS;
  // Held still while someone drags (as the displacement's range is), so a strike handle stays under the pointer.
  const velocityRange = useRef<number | null>(null);
  velocityRange.current = nextVelocityRangeMPerS(velocityRange.current, Math.max(0, ...(strike ?? []).map(([, v]) => Math.abs(v))));
  const velocityRangeMPerS = velocityRange.current;
  const halfHeightPx = heightPx / 2 - MARGIN_PX;
  const velocityToPx = (vMPerS: number) => heightPx / 2 - (vMPerS / velocityRangeMPerS) * halfHeightPx;
  const pxToVelocity = (px: number) => ((heightPx / 2 - px) / halfHeightPx) * velocityRangeMPerS;
  /*
   * What stays still while people drag (background, axis, scale, supports) is a layer of its own,
   * built only when the size, scale or theme changes: a drag redraws the string's layer, not this
   * one, and it is never hit-tested.
   */
  const backdrop = useMemo(() => {
    const ink = dark ? COLOURS.dark : COLOURS.light;
    const ticks = niceTicks([0, lengthM * 1000], 8).valuesMm.map((mm) => mm / 1000);
    return (
      <Layer listening={false}>
        <Rect width={widthPx} height={heightPx} fill={dark ? '#171b22' : '#ffffff'} />
        <Line points={[MARGIN_PX, midPx, widthPx - MARGIN_PX, midPx]} stroke={ink.axis} strokeWidth={1} />
        {ticks.map((tickM) => (
          <Group key={tickM}>
            <Line points={[scale.xToPx(tickM), heightPx - MARGIN_PX + 6, scale.xToPx(tickM), heightPx - MARGIN_PX + 12]} stroke={ink.text} strokeWidth={1} />
            <Text x={scale.xToPx(tickM) - 20} y={heightPx - MARGIN_PX + 14} width={40} align="center" text={`${Math.round(tickM * 1000)}`} fontSize={10} fill={ink.text} />
          </Group>
        ))}
        <Text x={widthPx - MARGIN_PX - 60} y={heightPx - 14} width={60} align="right" text="mm" fontSize={10} fill={ink.text} />
        <Text x={4} y={4} text={`±${(displayRangeM * 1000).toFixed(1)} mm (exaggerated)`} fontSize={10} fill={ink.text} />
        {[0, lengthM].map((xM) => (
          <Rect key={xM} x={scale.xToPx(xM) - 3} y={midPx - 14} width={6} height={28} fill={ink.text} cornerRadius={1} />
        ))}
      </Layer>
    );
  }, [dark, lengthM, widthPx, heightPx, midPx, displayRangeM, scale]);
  const modeLine = useMemo(() => {
    if (!highlightMode) return null;
    const samples = 200;
    const amplitude = peakM * 0.8;
    const out: number[] = [];
    for (let i = 0; i <= samples; i++) {
      const x = (lengthM * i) / samples;
      out.push(scale.xToPx(x), scale.yToPx(amplitude * Math.sin((highlightMode * Math.PI * x) / lengthM)));
    }
    return out;
  }, [highlightMode, lengthM, peakM, scale]);

  const edit = (change: Parameters<SessionConnection['edit']>[0]) => !readOnly && connection.edit(change);
  const parts = patch.excitation.parts ?? [];
  // A layer made by plucks or strikes moves with their handles; its points are shown, not dragged.
  const madeByParts = { displacement: partsMakeLayer(parts, 'displacement'), velocity: partsMakeLayer(parts, 'velocity') };
  const refusePointEdit = (layer: 'displacement' | 'velocity') => {
    let reason: string | null = null;
    connection.edit((doc) => void (reason = layerMadeByPartsReason(doc, layer)));
    if (reason) onStrokeProblem(`${(reason as string)[0].toUpperCase()}${(reason as string).slice(1)}.`);
  };
  const movePart = (index: number, changes: PartChanges, pointerXM?: number) => {
    if (pointerXM !== undefined) connection.setPresence({ pointerXM: Math.min(lengthM, Math.max(0, pointerXM)) });
    edit((doc, origin) => void updateExcitationPart(doc, index, changes, origin));
  };
  const partY = (index: number) => {
    const part = parts[index];
    return part.kind === 'pluck' ? scale.yToPx(part.heightM) : velocityToPx(part.velocityMPerS);
  };
  const draggingBy = new Map(peers.filter((peer) => peer.dragging?.layer === 'displacement' && !madeByParts.displacement).map((peer) => [peer.dragging!.index + 1, peer]));
  const partDraggedBy = (index: number) => peers.find((peer) => madeByParts[PART_LAYER[parts[index].kind]] && peer.dragging?.layer === PART_LAYER[parts[index].kind] && peer.dragging.index === index);
  const drawing = tool === 'draw' && !readOnly;
  const drawLayer = activeLayer === 'velocity' && strike ? 'velocity' : 'displacement';
  const strokeRef = useRef<PixelPoint[] | null>(null);
  const strokeLine = useRef<Konva.Line>(null);
  const pointerOf = (event: Konva.KonvaEventObject<MouseEvent>) => event.target.getStage()?.getPointerPosition() ?? null;
  const extendStroke = (x: number, y: number) => {
    strokeRef.current?.push([asPixels(x), asPixels(y)]);
    strokeLine.current?.points(strokeRef.current?.flat() ?? []);
    strokeLine.current?.getLayer()?.batchDraw();
  };
  const finishStroke = () => {
    const stroke = strokeRef.current;
    strokeRef.current = null;
    strokeLine.current?.points([]);
    if (!stroke || stroke.length < 2) return;
    // The stroke is read on the scale of the layer it replaces (the strike layer has its own).
    const mapping = createCanvasScale({ lengthM, widthPx, heightPx, marginPx: MARGIN_PX, displacementRangeM: drawLayer === 'velocity' ? velocityRangeMPerS : displayRangeM });
    const drawn = polylineFromStroke(stroke, mapping);
    if (!drawn.ok) return onStrokeProblem(`The stroke was not used: ${drawn.reason}.`);
    onStrokeProblem(null);
    if (madeByParts[drawLayer]) return refusePointEdit(drawLayer);
    onSelect(null);
    edit((doc, origin) => void replaceLayerPoints(doc, drawLayer, drawn.points, origin));
  };

  return (
    <>
    <Stage
      width={widthPx}
      height={heightPx}
      onMouseDown={(event) => {
        const pointer = pointerOf(event);
        if (!drawing || !pointer) return;
        strokeRef.current = [];
        extendStroke(pointer.x, pointer.y);
      }}
      onMouseMove={(event) => {
        const pointer = pointerOf(event);
        if (!pointer) return;
        connection.setPresence({ pointerXM: Math.min(lengthM, Math.max(0, scale.pxToX(pointer.x))) });
        if (strokeRef.current) extendStroke(pointer.x, pointer.y);
      }}
      onMouseUp={finishStroke}
      onMouseLeave={() => {
        finishStroke();
        connection.setPresence({ pointerXM: null });
      }}
      style={{ cursor: drawing ? 'crosshair' : undefined }}
    >
      {backdrop}
      <Layer>
        {modeLine && <Line points={modeLine} stroke={colours.mode} strokeWidth={1.5} dash={[6, 4]} opacity={0.8} />}
        <Line
          points={flat}
          stroke={colours.string}
          strokeWidth={2.5}
          hitStrokeWidth={14}
          listening={!drawing}
          onClick={(event) => {
            const pointer = event.target.getStage()?.getPointerPosition();
            if (!pointer) return;
            const layer = activeLayer === 'velocity' && strike ? 'velocity' : 'displacement';
            if (madeByParts[layer]) return refusePointEdit(layer);
            if (layer === 'velocity') edit((doc, origin) => void insertPoint(doc, 'velocity', scale.pxToX(pointer.x), pxToVelocity(pointer.y), origin));
            else edit((doc, origin) => void insertPoint(doc, 'displacement', scale.pxToX(pointer.x), scale.pxToY(pointer.y), origin));
          }}
        />
        {/* Interior points: index i in the document is point i + 1 of the polyline. */}
        {points.slice(1, -1).map(([xM, yM], docIndex) => {
          const peer = draggingBy.get(docIndex + 1);
          return (
            <Group key={docIndex}>
              {peer && <Circle x={scale.xToPx(xM)} y={scale.yToPx(yM)} radius={12} stroke={peer.colour} strokeWidth={2} />}
              <Circle
                x={scale.xToPx(xM)}
                y={scale.yToPx(yM)}
                radius={madeByParts.displacement ? 3 : sameSelection(selected, { layer: 'displacement', index: docIndex }) ? 8 : 6}
                fill={colours.point}
                stroke={sameSelection(selected, { layer: 'displacement', index: docIndex }) ? colours.pickup : undefined}
                strokeWidth={2}
                draggable={!readOnly && !madeByParts.displacement}
                listening={!drawing && !madeByParts.displacement}
                name={`point-${docIndex}`}
                onMouseDown={() => onSelect({ layer: 'displacement', index: docIndex })}
                onDblClick={() => edit((doc, origin) => void deletePoint(doc, 'displacement', docIndex, origin))}
                onDragStart={() => {
                  connection.beginGesture();
                  connection.setPresence({ dragging: { layer: 'displacement', index: docIndex } });
                }}
                onDragMove={(event) => {
                  const node = event.target;
                  edit((doc, origin) => void movePoint(doc, 'displacement', docIndex, scale.pxToX(node.x()), scale.pxToY(node.y()), origin));
                }}
                onDragEnd={() => {
                  connection.endGesture();
                  connection.setPresence({ dragging: null });
                }}
              />
            </Group>
          );
        })}
        {showStrike && strike && (
          <>
            <Line points={strike.flatMap(([x, v]) => [scale.xToPx(x), velocityToPx(v)])} stroke={colours.pickup} strokeWidth={2} dash={[8, 4]} />
            <Text x={4} y={18} text={`strike layer ±${velocityRangeMPerS.toPrecision(2)} m/s`} fontSize={10} fill={colours.pickup} />
            {strike.slice(1, -1).map(([xM, vMPerS], docIndex) => (
              <Circle
                key={`v-${docIndex}`}
                x={scale.xToPx(xM)}
                y={velocityToPx(vMPerS)}
                radius={madeByParts.velocity ? 3 : sameSelection(selected, { layer: 'velocity', index: docIndex }) ? 7 : 5}
                fill={colours.pickup}
                stroke={sameSelection(selected, { layer: 'velocity', index: docIndex }) ? colours.point : undefined}
                strokeWidth={2}
                draggable={!readOnly && !madeByParts.velocity}
                listening={!drawing && !madeByParts.velocity}
                name={`strike-point-${docIndex}`}
                onMouseDown={() => onSelect({ layer: 'velocity', index: docIndex })}
                onDragStart={() => {
                  connection.beginGesture();
                  connection.setPresence({ dragging: { layer: 'velocity', index: docIndex } });
                }}
                onDragMove={(event) => edit((doc, origin) => void movePoint(doc, 'velocity', docIndex, scale.pxToX(event.target.x()), pxToVelocity(event.target.y()), origin))}
                onDragEnd={() => {
                  connection.endGesture();
                  connection.setPresence({ dragging: null });
                }}
                onDblClick={() => edit((doc, origin) => void deletePoint(doc, 'velocity', docIndex, origin))}
              />
            ))}
          </>
        )}
        {/* Plucks and strikes: drag the ring along and up or down, its contact's edges sideways. */}
        {parts.map((part, index) => {
          if (part.kind === 'strike' && !showStrike) return null;
          const colour = part.kind === 'pluck' ? colours.string : colours.pickup;
          const isSelected = sameSelection(selected, { layer: 'part', index });
          const centreX = scale.xToPx(part.positionM);
          const centreY = partY(index);
          const beginDrag = () => {
            onSelect({ layer: 'part', index });
            connection.beginGesture();
            // On a layer made by plucks or strikes, the dragged index is the part's (its points are not dragged).
            connection.setPresence({ dragging: { layer: PART_LAYER[part.kind], index } });
          };
          const endDrag = () => {
            connection.endGesture();
            connection.setPresence({ dragging: null });
          };
          return (
            <Group key={`part-${index}`}>
              {/* The contact (a thick bar) and, a little outside each of its edges so they never hide under the ring, the grips that set its width. */}
              <Line points={[scale.xToPx(part.positionM - part.widthM / 2) - EDGE_GRIP_PX, centreY, scale.xToPx(part.positionM + part.widthM / 2) + EDGE_GRIP_PX, centreY]} stroke={colour} strokeWidth={1} dash={[2, 2]} listening={false} />
              <Line points={[scale.xToPx(part.positionM - part.widthM / 2), centreY, scale.xToPx(part.positionM + part.widthM / 2), centreY]} stroke={colour} strokeWidth={4} opacity={0.6} listening={false} />
              {([-1, 1] as const).map((side) => (
                <Rect
                  key={side}
                  name={`part-${index}-edge-${side < 0 ? 'left' : 'right'}`}
                  x={scale.xToPx(part.positionM + (side * part.widthM) / 2) + side * EDGE_GRIP_PX - 3}
                  y={centreY - 9}
                  width={6}
                  height={18}
                  fill={colour}
                  cornerRadius={2}
                  draggable={!readOnly}
                  listening={!drawing}
                  dragBoundFunc={(position) => ({ x: position.x, y: centreY - 9 })}
                  onDragStart={beginDrag}
                  onDragMove={(event) => {
                    const edgeM = scale.pxToX(event.target.x() + 3 - side * EDGE_GRIP_PX);
                    movePart(index, { widthM: 2 * Math.max(0, side * (edgeM - part.positionM)) }, edgeM);
                  }}
                  onDragEnd={endDrag}
                />
              ))}
              <Group
                x={centreX}
                y={centreY}
                name={`part-${index}`}
                draggable={!readOnly}
                listening={!drawing}
                onMouseDown={() => onSelect({ layer: 'part', index })}
                onDragStart={beginDrag}
                onDragMove={(event) => {
                  const xM = scale.pxToX(event.target.x());
                  const y = event.target.y();
                  movePart(index, part.kind === 'pluck' ? { positionM: xM, heightM: scale.pxToY(y) } : { positionM: xM, velocityMPerS: pxToVelocity(y) }, xM);
                }}
                onDragEnd={endDrag}
              >
                {partDraggedBy(index) && <Circle radius={16} stroke={partDraggedBy(index)!.colour} strokeWidth={2} />}
                <Circle radius={isSelected ? 12 : 10} stroke={isSelected ? colours.text : colour} strokeWidth={isSelected ? 3 : 2.5} fill={dark ? '#171b22' : '#ffffff'} opacity={0.95} />
                <Circle radius={3.5} fill={colour} />
                <Text x={-40} y={-28} width={80} align="center" text={`${part.kind} ${partOrdinal(parts, index)}`} fontSize={10} fill={colour} />
              </Group>
            </Group>
          );
        })}
        <Group
          x={scale.xToPx(patch.pickup.positionM)}
          y={midPx}
          draggable={!readOnly}
          listening={!drawing}
          onMouseDown={() => onSelect({ layer: 'pickup' })}
          dragBoundFunc={(position) => ({ x: Math.min(widthPx - MARGIN_PX - 1, Math.max(MARGIN_PX + 1, position.x)), y: midPx })}
          onDragStart={() => {
            connection.beginGesture();
            connection.setPresence({ dragging: { layer: 'pickup', index: 0 } });
          }}
          onDragMove={(event) => edit((doc, origin) => movePickup(doc, scale.pxToX(event.target.x()), origin))}
          onDragEnd={() => {
            connection.endGesture();
            connection.setPresence({ dragging: null });
          }}
          name="pickup"
        >
          <Line points={[0, -22, -7, -34, 7, -34]} closed fill={colours.pickup} stroke={selected?.layer === 'pickup' ? colours.point : undefined} strokeWidth={2} />
          <Text x={-30} y={-48} width={60} align="center" text="pickup" fontSize={10} fill={colours.pickup} />
        </Group>
        <Line ref={strokeLine} points={NO_POINTS} stroke={drawLayer === 'velocity' ? colours.pickup : colours.string} strokeWidth={1.5} opacity={0.7} listening={false} />
      </Layer>
      {/* Teammates' pointers: redrawn as they move, never hit-tested. */}
      <Layer listening={false}>
        {peers
          .filter((peer) => peer.pointerXM !== null)
          .map((peer) => (
            <Group key={peer.clientId} x={scale.xToPx(peer.pointerXM as number)} y={MARGIN_PX / 2}>
              <Line points={[0, 0, 0, heightPx - MARGIN_PX * 1.5]} stroke={peer.colour} strokeWidth={1} dash={[3, 3]} />
              <Text x={4} y={0} text={peer.name} fontSize={11} fill={peer.colour} />
            </Group>
          ))}
      </Layer>
    </Stage>
    {parts.length > 0 && (
      <ul className="sr-only" aria-label="Plucks and strikes">
        {parts.map((part, index) => (
          <li
            key={index}
            data-testid="excitation-part"
            data-kind={part.kind}
            data-position-mm={(part.positionM * 1000).toFixed(2)}
            data-width-mm={(part.widthM * 1000).toFixed(2)}
            data-x-px={scale.xToPx(part.positionM).toFixed(1)}
            data-y-px={partY(index).toFixed(1)}
            data-right-grip-x-px={(scale.xToPx(part.positionM + part.widthM / 2) + EDGE_GRIP_PX).toFixed(1)}
          >
            {part.kind === 'pluck'
              ? `Pluck ${partOrdinal(parts, index)}: ${(part.positionM * 1000).toFixed(1)} mm along, ${(part.heightM * 1000).toFixed(2)} mm high, ${(part.widthM * 1000).toFixed(1)} mm ${part.contact} contact`
              : `Strike ${partOrdinal(parts, index)}: ${(part.positionM * 1000).toFixed(1)} mm along, ${part.velocityMPerS.toFixed(2)} m/s, ${(part.widthM * 1000).toFixed(1)} mm hammer`}
          </li>
        ))}
      </ul>
    )}
    </>
  );
}


/**
 * The vertical scale keeps still while someone drags (so a point stays under the pointer) and
 * changes only when the shape outgrows it or shrinks to under a third of it.
 */
export function nextDisplayRangeM(currentM: number | null, peakM: number): number {
  const wanted = Math.max(1e-3, peakM) * 1.6;
  if (currentM === null || peakM > currentM * 0.95 || peakM < currentM / 3) return wanted;
  return currentM;
}

/** The strike layer's vertical scale, kept by the same rule as `nextDisplayRangeM` (at least ±0.16 m/s). */
export function nextVelocityRangeMPerS(currentMPerS: number | null, peakMPerS: number): number {
  const wanted = Math.max(0.1, peakMPerS) * 1.6;
  if (currentMPerS === null || peakMPerS > currentMPerS * 0.95 || wanted < currentMPerS / 3) return wanted;
  return currentMPerS;
}
