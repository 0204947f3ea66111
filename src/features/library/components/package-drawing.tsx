import { Arrow, Circle, Group, Layer, Line, Rect, Stage, Text } from 'react-konva';
import { fixed } from '../../../lib/format';

export interface DrawingValues {
  family: string;
  bodyLength: number;
  bodyWidth: number;
  bodyHeight?: number;
  offsetX: number;
  offsetY: number;
  courtyard: number;
  rotationOffset: number;
  polarised: boolean;
}

const C = {
  bg: '#171d22',
  grid: '#262f36',
  body: '#c9692b',
  bodyFill: 'rgba(201,105,43,0.18)',
  courtyard: '#a9b6c0',
  origin: '#f5f7f8',
  arrow: '#4fae7a',
  ref: '#5d6f7e',
  dim: '#cdd5db',
  pin: '#e0a526',
};

const TWO_TERMINAL = new Set(['chip', 'MELF', 'SOD', 'electrolytic', 'crystal']);
const ok = (v: number) => Number.isFinite(v);
const fmt = (v: number) => `${fixed(v)} mm`;

/**
 * The package to scale in its zero orientation (shared/README.md, "Check values and their sources": body length along X, pin 1
 * or the cathode on the left, ICs with pin 1 at the upper left), seen from the top: body, courtyard,
 * pin-1 mark, the placement origin, the body offset and an arrow for zero orientation turned by the
 * rotation offset. Draws what the form holds; computes nothing that matters elsewhere.
 */
export function PackageDrawing({ values, width = 438, height = 360 }: { values: DrawingValues; width?: number; height?: number }) {
  const L = ok(values.bodyLength) && values.bodyLength > 0 ? values.bodyLength : 0;
  const W = ok(values.bodyWidth) && values.bodyWidth > 0 ? values.bodyWidth : 0;
  const cy = ok(values.courtyard) && values.courtyard >= 0 ? values.courtyard : 0;
  const ox = ok(values.offsetX) ? values.offsetX : 0;
  const oy = ok(values.offsetY) ? values.offsetY : 0;
  const rot = ok(values.rotationOffset) ? values.rotationOffset : 0;
  const valid = L > 0 && W > 0;

  // Extent to fit: courtyard rectangle, the origin, and the arrow (as long as the larger body side).
  const arrowLen = Math.max(L, W, 0.5) * 0.75;
  const rad0 = (rot * Math.PI) / 180;
  const xs = [ox - L / 2 - cy, ox + L / 2 + cy, 0, Math.cos(rad0) * arrowLen * 1.15, rot !== 0 ? arrowLen : 0];
  const ys = [oy - W / 2 - cy, oy + W / 2 + cy, 0, Math.sin(rad0) * arrowLen * 1.15];
  const minX = Math.min(...xs), maxX = Math.max(...xs), minY = Math.min(...ys), maxY = Math.max(...ys);
  const margin = { l: 112, r: 70, t: 40, b: 44 };
  const s = Math.min((width - margin.l - margin.r) / Math.max(maxX - minX, 1e-3), (height - margin.t - margin.b) / Math.max(maxY - minY, 1e-3));
  const cx0 = margin.l + ((width - margin.l - margin.r) - (maxX - minX) * s) / 2 - minX * s;
  const cy0 = margin.t + ((height - margin.t - margin.b) - (maxY - minY) * s) / 2 + maxY * s;
  // mm (Y up) → canvas px (Y down)
  const px = (x: number) => cx0 + x * s;
  const py = (y: number) => cy0 - y * s;

  const bx = px(ox - L / 2), by = py(oy + W / 2);
  const twoTerminal = TWO_TERMINAL.has(values.family);
  const rad = (rot * Math.PI) / 180;
  const ax = Math.cos(rad) * arrowLen, ay = Math.sin(rad) * arrowLen;
  const dimY = py(oy - W / 2 - cy) + 20;
  const dimX = px(ox - L / 2 - cy) - 18;
  const bodyPx = Math.min(L, W) * s;
  const pinR = Math.max(2.5, Math.min(6, bodyPx * 0.12));

  return (
    <figure aria-label="Package drawing" className="overflow-hidden rounded border border-ink-800 bg-ink-900">
      <Stage width={width} height={height}>
        <Layer listening={false}>
          <Rect x={0} y={0} width={width} height={height} fill={C.bg} />
          {!valid ? (
            <Text x={20} y={height / 2 - 10} width={width - 40} align="center" text="Enter a body length and width above 0 mm to see the drawing." fill={C.dim} fontSize={13} />
          ) : (
            <>
              {/* X reference through the origin */}
              <Line points={[px(minX) - 10, py(0), px(maxX) + 10, py(0)]} stroke={C.grid} strokeWidth={1} />
              <Line points={[px(0), py(maxY) - 10, px(0), py(minY) + 10]} stroke={C.grid} strokeWidth={1} />
              {/* courtyard */}
              {cy > 0 && (
                <Rect x={px(ox - L / 2 - cy)} y={py(oy + W / 2 + cy)} width={(L + 2 * cy) * s} height={(W + 2 * cy) * s} stroke={C.courtyard} strokeWidth={1} dash={[5, 4]} />
              )}
              {/* body */}
              <Rect x={bx} y={by} width={L * s} height={W * s} stroke={C.body} strokeWidth={2} fill={C.bodyFill} />
              {/* pin 1 / cathode */}
              {twoTerminal ? (
                values.polarised && <Rect x={bx + 2} y={by + 2} width={Math.max(3, L * s * 0.12)} height={W * s - 4} fill={C.pin} opacity={0.85} />
              ) : (
                <Circle x={bx + pinR * 2} y={by + pinR * 2} radius={pinR} fill={C.pin} />
              )}
              {/* zero orientation with the rotation offset applied */}
              {rot !== 0 && <Arrow points={[px(0), py(0), px(arrowLen), py(0)]} stroke={C.ref} fill={C.ref} strokeWidth={1} dash={[4, 4]} pointerLength={6} pointerWidth={6} />}
              <Arrow points={[px(0), py(0), px(ax), py(ay)]} stroke={C.arrow} fill={C.arrow} strokeWidth={2.5} pointerLength={9} pointerWidth={9} />
              <Text x={px(ax) + (ax >= 0 ? 6 : -96)} y={py(ay) + (ay >= 0 ? -18 : 4)} width={90} align={ax >= 0 ? 'left' : 'right'} text={`zero ${rot === 0 ? '0°' : `${rot > 0 ? '+' : ''}${rot}°`}`} fill={C.arrow} fontSize={12} fontFamily="Roboto Mono, monospace" />
              {/* origin */}
              <Group x={px(0)} y={py(0)}>
                <Circle radius={3.5} stroke={C.origin} strokeWidth={1.5} />
                <Line points={[-7, 0, 7, 0]} stroke={C.origin} strokeWidth={1} />
                <Line points={[0, -7, 0, 7]} stroke={C.origin} strokeWidth={1} />
              </Group>
              {(ox !== 0 || oy !== 0) && (
                <>
                  <Line points={[px(0), py(0), px(ox), py(oy)]} stroke={C.dim} strokeWidth={1} dash={[2, 3]} />
                  <Circle x={px(ox)} y={py(oy)} radius={2.5} fill={C.body} />
                </>
              )}
              {/* length dimension */}
              <Line points={[bx, dimY - 8, bx, dimY + 4]} stroke={C.dim} strokeWidth={1} />
              <Line points={[bx + L * s, dimY - 8, bx + L * s, dimY + 4]} stroke={C.dim} strokeWidth={1} />
              <Arrow points={[bx + (L * s) / 2, dimY, bx, dimY]} stroke={C.dim} fill={C.dim} strokeWidth={1} pointerLength={5} pointerWidth={5} />
              <Arrow points={[bx + (L * s) / 2, dimY, bx + L * s, dimY]} stroke={C.dim} fill={C.dim} strokeWidth={1} pointerLength={5} pointerWidth={5} />
              <Text x={bx + (L * s) / 2 - 60} y={dimY + 6} width={120} align="center" text={`L ${fmt(L)}`} fill={C.dim} fontSize={12} fontFamily="Roboto Mono, monospace" />
              {/* width dimension */}
              <Line points={[dimX - 4, by, dimX + 8, by]} stroke={C.dim} strokeWidth={1} />
              <Line points={[dimX - 4, by + W * s, dimX + 8, by + W * s]} stroke={C.dim} strokeWidth={1} />
              <Arrow points={[dimX, by + (W * s) / 2, dimX, by]} stroke={C.dim} fill={C.dim} strokeWidth={1} pointerLength={5} pointerWidth={5} />
              <Arrow points={[dimX, by + (W * s) / 2, dimX, by + W * s]} stroke={C.dim} fill={C.dim} strokeWidth={1} pointerLength={5} pointerWidth={5} />
              <Text x={dimX - 106} y={by + (W * s) / 2 - 7} width={100} align="right" text={`W ${fmt(W)}`} fill={C.dim} fontSize={12} fontFamily="Roboto Mono, monospace" />
            </>
          )}
          {/* legend */}
          <Text x={10} y={8} text="Top view, zero orientation" fill={C.dim} fontSize={12} />
        </Layer>
      </Stage>
      {valid && (
        <p className="num border-t border-ink-800 px-3 py-1.5 text-2xs text-ink-300">
          courtyard {fmt(cy)}
          {(ox !== 0 || oy !== 0) && <> · body offset {fixed(ox)}, {fixed(oy)} mm</>}
          {values.bodyHeight != null && values.bodyHeight > 0 && <> · height {fmt(values.bodyHeight)}</>}
          {rot !== 0 && <> · rotation offset {rot}°</>}
        </p>
      )}
      <figcaption className="flex flex-wrap gap-x-4 gap-y-1 border-t border-ink-800 px-3 py-2 text-2xs text-ink-300">
        <span><span className="inline-block h-2 w-3 border-2 align-middle" style={{ borderColor: C.body }} /> body</span>
        <span><span className="inline-block h-2 w-3 border border-dashed align-middle" style={{ borderColor: C.courtyard }} /> courtyard</span>
        <span><span className="inline-block h-2 w-2 rounded-full align-middle" style={{ background: C.pin }} /> {twoTerminal ? 'cathode / + end' : 'pin 1'}</span>
        <span><span className="align-middle" style={{ color: C.arrow }}>→</span> zero orientation, rotation offset applied</span>
        <span>⊕ placement origin</span>
      </figcaption>
    </figure>
  );
}
