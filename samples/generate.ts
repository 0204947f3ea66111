// Generates the demo samples (Harrow Creek Instruments, an invented scenario):
//   samples/library.json, samples/weather-station/{weather-ctl.csv,job.json},
//   samples/led-strip/{led-strip.csv,job.json,job-overrides.json}
// Run: node --import tsx samples/generate.ts   (deterministic: a seeded PRNG; the outputs are committed)
// Parts are laid out with a self-check so the samples hold no body or courtyard overlap, no part
// off its board, no fiducial clearance violation and no nozzle shadow.
import { writeFileSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { library } from './library.source';
import { mulberry32 } from '../tests/helpers/prng';

const here = dirname(fileURLToPath(import.meta.url));


type Pkg = (typeof library.packages)[number];
const pkgByName = new Map(library.packages.map((p) => [p.name, p]));
const holderOf = (p: Pkg): number => {
  const noz = p.nozzles?.[0] ?? 'N40';
  return library.nozzles.find((n) => n.name === noz)!.holderRadius;
};

interface Placed {
  ref: string;
  pkg: Pkg;
  side: 'top' | 'bottom';
  u: number; // board frame
  v: number;
  rot: number; // design rotation (top: θ; bottom: θb, bottom view)
  box: { x0: number; y0: number; x1: number; y1: number }; // body AABB, board frame, top view
  cx: number;
  cy: number;
}

function bodyBox(pkg: Pkg, side: 'top' | 'bottom', u: number, v: number, rot: number) {
  const r = (((rot + ((pkg as { rotationOffset?: number }).rotationOffset ?? 0)) % 360) + 360) % 360;
  const c = Math.round(Math.cos((r * Math.PI) / 180));
  const s = Math.round(Math.sin((r * Math.PI) / 180));
  const b = pkg.body as { length: number; width: number; offsetX?: number; offsetY?: number };
  let ox = c * (b.offsetX ?? 0) - s * (b.offsetY ?? 0);
  const oy = s * (b.offsetX ?? 0) + c * (b.offsetY ?? 0);
  if (side === 'bottom') ox = -ox; // the offset is turned in the bottom view; mirror it back to the top view
  const swap = r === 90 || r === 270;
  const hl = (swap ? b.width : b.length) / 2;
  const hw = (swap ? b.length : b.width) / 2;
  const cx = u + ox;
  const cy = v + oy;
  return { box: { x0: cx - hl, y0: cy - hw, x1: cx + hl, y1: cy + hw }, cx, cy };
}

function axisGap(a: Placed['box'], b: Placed['box']): number {
  return Math.max(a.x0 - b.x1, b.x0 - a.x1, a.y0 - b.y1, b.y0 - a.y1);
}
function pointToBox(x: number, y: number, b: Placed['box']): number {
  const dx = Math.max(b.x0 - x, 0, x - b.x1);
  const dy = Math.max(b.y0 - y, 0, y - b.y1);
  return Math.hypot(dx, dy);
}

function fits(
  cand: Placed,
  placed: Placed[],
  W: number,
  H: number,
  fids: { side: string; u: number; v: number; r: number }[],
  edge = 1.0,
): boolean {
  const b = cand.box;
  if (b.x0 < edge || b.y0 < edge || b.x1 > W - edge || b.y1 > H - edge) return false;
  for (const f of fids) if (f.side === cand.side && pointToBox(f.u, f.v, b) < f.r + 1.5) return false;
  const cc = (cand.pkg as { courtyard?: number }).courtyard ?? 0.25;
  for (const p of placed) {
    if (p.side !== cand.side) continue;
    const pc = (p.pkg as { courtyard?: number }).courtyard ?? 0.25;
    if (axisGap(b, p.box) < cc + pc + 0.2) return false;
    const hc = cand.pkg.body.height, hp = p.pkg.body.height;
    if (hp > hc + 0.5 && pointToBox(cand.cx, cand.cy, p.box) < holderOf(cand.pkg) + 0.3) return false;
    if (hc > hp + 0.5 && pointToBox(p.cx, p.cy, b) < holderOf(p.pkg) + 0.3) return false;
  }
  return true;
}

interface Group {
  prefix: string;
  pkg: string;
  count: number;
  side: 'top' | 'bottom';
  rots: number[];
  values: string[];
  pn: (value: string) => string;
}

function layout(groups: Group[], W: number, H: number, fids: { side: string; u: number; v: number; r: number }[], seed: number, grid: number) {
  const rnd = mulberry32(seed);
  const placed: Placed[] = [];
  const counters = new Map<string, number>();
  const meta = new Map<string, { value: string; pn: string }>();
  for (const g of groups) {
    const pkg = pkgByName.get(g.pkg)!;
    for (let i = 0; i < g.count; i++) {
      const n = (counters.get(g.prefix) ?? 0) + 1;
      counters.set(g.prefix, n);
      const ref = g.prefix + n;
      let ok = false;
      for (let t = 0; t < 20000 && !ok; t++) {
        const u = Math.round((rnd() * W) / grid) * grid;
        const v = Math.round((rnd() * H) / grid) * grid;
        const rot = g.rots[Math.floor(rnd() * g.rots.length)];
        const { box, cx, cy } = bodyBox(pkg, g.side, u, v, rot);
        const cand: Placed = { ref, pkg, side: g.side, u, v, rot, box, cx, cy };
        if (fits(cand, placed, W, H, fids)) {
          placed.push(cand);
          ok = true;
        }
      }
      if (!ok) throw new Error(`could not place ${ref} (${g.pkg})`);
      const value = g.values[Math.floor(rnd() * g.values.length)];
      meta.set(ref, { value, pn: g.pn(value) });
    }
  }
  return { placed, meta };
}

const r3 = (v: number) => Math.round(v * 1000) / 1000;

// ---------------------------------------------------------------- weather-station controller
function weatherStation() {
  const W = 100, H = 80, originX = 25, originY = 40;
  const localFids = [
    { name: 'FL1', side: 'top', u: 3.5, v: 3.5, r: 1.0 },
    { name: 'FL2', side: 'top', u: 96.5, v: 76.5, r: 1.0 },
    { name: 'FL3', side: 'top', u: 96.5, v: 3.5, r: 1.0 },
  ];
  const res = (v: string) => `HCI-R-${v.toUpperCase()}`;
  const cap = (v: string) => `HCI-C-${v.toUpperCase().replace('/', '-')}`;
  const ic = (code: string) => () => `HCI-IC-${code}`;
  const top: Group[] = [
    { prefix: 'J', pkg: 'HDR-1x4-2.0', count: 2, side: 'top', rots: [0, 180], values: ['SENSOR-BUS', 'RS485'], pn: () => 'HCI-J-0404' },
    { prefix: 'C', pkg: 'ECAP-6.3x5.8', count: 2, side: 'top', rots: [0], values: ['100u/25V', '220u/16V'], pn: cap },
    { prefix: 'SW', pkg: 'SW-TACT-6x6', count: 1, side: 'top', rots: [0], values: ['RESET'], pn: () => 'HCI-SW-0606' },
    { prefix: 'U', pkg: 'TQFP-48-7x7', count: 1, side: 'top', rots: [0], values: ['HCW-M48'], pn: ic('0048') },
    { prefix: 'U', pkg: 'QFN-32-5x5', count: 1, side: 'top', rots: [0, 90], values: ['HCW-RF32'], pn: ic('0132') },
    { prefix: 'U', pkg: 'SOT-223', count: 1, side: 'top', rots: [0, 180], values: ['REG-3V3'], pn: ic('0223') },
    { prefix: 'U', pkg: 'SOIC-8', count: 2, side: 'top', rots: [0, 90], values: ['FLASH-16M', 'RS485-XCVR'], pn: (v) => `HCI-IC-${v}` },
    { prefix: 'U', pkg: 'LGA-8-2.5x2.5', count: 1, side: 'top', rots: [0], values: ['THP-SENSE'], pn: ic('0825') },
    { prefix: 'L', pkg: 'IND-4x4', count: 1, side: 'top', rots: [0], values: ['10u'], pn: () => 'HCI-L-10U-4040' },
    { prefix: 'D', pkg: 'SMA', count: 1, side: 'top', rots: [0, 180], values: ['TVS-24V'], pn: () => 'HCI-D-TVS24' },
    { prefix: 'R', pkg: 'R2512', count: 1, side: 'top', rots: [0], values: ['0R050'], pn: res },
    { prefix: 'C', pkg: 'C1210', count: 1, side: 'top', rots: [0, 90], values: ['22u/25V'], pn: cap },
    { prefix: 'Y', pkg: 'XTAL-3225', count: 1, side: 'top', rots: [0, 90], values: ['16MHz'], pn: () => 'HCI-Y-16M' },
    { prefix: 'Q', pkg: 'SOT-23', count: 3, side: 'top', rots: [0, 90, 180, 270], values: ['NMOS-30V', 'PNP-40V'], pn: (v) => `HCI-Q-${v}` },
    { prefix: 'D', pkg: 'SOD-123', count: 2, side: 'top', rots: [0, 180], values: ['SCHOTTKY-40V'], pn: () => 'HCI-D-SK40' },
    { prefix: 'C', pkg: 'C1206', count: 3, side: 'top', rots: [0, 90], values: ['10u/25V'], pn: cap },
    { prefix: 'C', pkg: 'C0805', count: 6, side: 'top', rots: [0, 90, 180, 270], values: ['4u7/16V', '1u/25V'], pn: cap },
    { prefix: 'R', pkg: 'R0805', count: 2, side: 'top', rots: [0, 90], values: ['120R', '0R'], pn: res },
    { prefix: 'D', pkg: 'LED0603', count: 3, side: 'top', rots: [0, 180], values: ['GREEN', 'AMBER', 'RED'], pn: (v) => `HCI-D-LED-${v}` },
    { prefix: 'C', pkg: 'C0603', count: 12, side: 'top', rots: [0, 90, 180, 270], values: ['1u/16V', '2u2/10V'], pn: cap },
    { prefix: 'R', pkg: 'R0603', count: 10, side: 'top', rots: [0, 90, 180, 270], values: ['1k', '4k7', '10k'], pn: res },
    { prefix: 'C', pkg: 'C0402', count: 40, side: 'top', rots: [0, 90, 180, 270], values: ['100n/16V', '10n/50V', '22p/50V'], pn: cap },
    { prefix: 'R', pkg: 'R0402', count: 35, side: 'top', rots: [0, 90, 180, 270], values: ['10k', '4k7', '100k', '33R', '1k'], pn: res },
  ];
  const bottom: Group[] = [
    { prefix: 'U', pkg: 'SOIC-8', count: 1, side: 'bottom', rots: [0, 90], values: ['RTC-I2C'], pn: (v) => `HCI-IC-${v}` },
    { prefix: 'Q', pkg: 'SOT-23', count: 2, side: 'bottom', rots: [0, 90, 180, 270], values: ['NMOS-30V'], pn: (v) => `HCI-Q-${v}` },
    { prefix: 'C', pkg: 'C0603', count: 6, side: 'bottom', rots: [0, 90, 180, 270], values: ['1u/16V'], pn: cap },
    { prefix: 'R', pkg: 'R0603', count: 4, side: 'bottom', rots: [0, 90, 180, 270], values: ['2k2', '10k'], pn: res },
    { prefix: 'C', pkg: 'C0402', count: 20, side: 'bottom', rots: [0, 90, 180, 270], values: ['100n/16V', '1n/50V'], pn: cap },
    { prefix: 'R', pkg: 'R0402', count: 15, side: 'bottom', rots: [0, 90, 180, 270], values: ['10k', '47k', '1k'], pn: res },
  ];
  const { placed, meta } = layout([...top, ...bottom], W, H, localFids, 20260311, 0.25);
  // file order: by reference prefix and number, top then bottom, as a CAD export would list them
  const rows = placed.map((p) => ({ p, ...meta.get(p.ref)! }));
  rows.sort((a, b) => {
    const pa = a.p.ref.replace(/\d+$/, ''), pb = b.p.ref.replace(/\d+$/, '');
    return pa.localeCompare(pb) || Number(a.p.ref.slice(pa.length)) - Number(b.p.ref.slice(pb.length));
  });
  const csv = ['Ref,Val,Package,PosX,PosY,Rot,Side,PN'];
  const aliasFor: Record<string, string> = { 'SOT-23': 'SOT23', 'SOIC-8': 'SOIC8', 'QFN-32-5x5': 'QFN32-5x5', 'TQFP-48-7x7': 'TQFP48-7x7', 'LGA-8-2.5x2.5': 'LGA8-2.5x2.5', 'SOT-223': 'SOT223', 'SOD-123': 'SOD123' };
  for (const { p, value } of rows) {
    const q = (s: string) => (/[",]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
    csv.push([p.ref, q(value), aliasFor[p.pkg.name] ?? p.pkg.name, r3(p.u + originX).toFixed(3), r3(p.v + originY).toFixed(3), p.rot.toFixed(1), p.side, q(meta.get(p.ref)!.pn)].join(','));
  }

  // panel: 2-up, 220 × 100 mm; true machine transforms (invented) give the "measured" positions
  const panel = { width: 220, height: 100, grid: { rows: 1, cols: 2, pitchX: 105, pitchY: 0, offsetX: 7.5, offsetY: 10 } };
  const noise = mulberry32(7);
  const jitter = () => r3((noise() - 0.5) * 0.008);
  const trueT = (rotDeg: number, scale: number, tx: number, ty: number) => (x: number, y: number) => {
    const r = (rotDeg * Math.PI) / 180;
    return { x: r3(scale * (Math.cos(r) * x - Math.sin(r) * y) + tx + jitter()), y: r3(scale * (Math.sin(r) * x + Math.cos(r) * y) + ty + jitter()) };
  };
  const topT = trueT(0.12, 1.00008, 42.3, 31.7);
  const botT = trueT(-0.2, 0.99995, 38.9, 33.4);
  const topPanelFids = [
    { name: 'PT1', x: 3.5, y: 5 },
    { name: 'PT2', x: 216.5, y: 5 },
    { name: 'PT3', x: 3.5, y: 95 },
    { name: 'PT4', x: 150, y: 96 },
  ];
  const botPanelFids = [
    { name: 'PB1', x: 10, y: 4 },
    { name: 'PB2', x: 210, y: 4 },
    { name: 'PB3', x: 216.5, y: 95 },
  ];
  const fiducials: unknown[] = [];
  for (const f of topPanelFids) fiducials.push({ name: f.name, side: 'top', frame: 'panel', x: f.x, y: f.y, measured: topT(f.x, f.y), clearRadius: 1.0 });
  for (const f of botPanelFids) {
    const flipped = { x: panel.width - f.x, y: f.y }; // bottom panel frame, vertical flip axis
    fiducials.push({ name: f.name, side: 'bottom', frame: 'panel', x: f.x, y: f.y, measured: botT(flipped.x, flipped.y), clearRadius: 1.0 });
  }
  // board 2 measured on its local fiducials (local correction): a slightly shifted, turned board
  const b2 = (u: number, v: number) => ({ x: 7.5 + 105 + u, y: 10 + v });
  const localT = trueT(0.135, 1.00008, 42.33, 31.68);
  for (const f of localFids) {
    const p = b2(f.u, f.v);
    fiducials.push({ name: f.name, side: 'top', frame: 'board', x: f.u, y: f.v, measured: { '2': localT(p.x, p.y) }, clearRadius: 1.0 });
  }
  const job = {
    centroid: 'weather-ctl.csv',
    import: { units: 'mm', bottomRotation: 'bottom-view', map: {} },
    board: { originX, originY, width: W, height: H },
    panel: { width: panel.width, height: panel.height, flipAxis: 'vertical', grid: { ...panel.grid, rotation: 0, cellRotations: [], skip: [] } },
    fiducials,
    transform: 'auto',
    library: '../library.json',
    machine: { name: 'HC line A (desktop)', reachX: 400, reachY: 400, nozzles: ['N05', 'N07', 'N10', 'N14', 'N25', 'N40'] },
    program: 'weather-ctl',
    revision: 'B',
  };
  return { csv: csv.join('\n') + '\n', job, count: placed.length };
}

// ---------------------------------------------------------------- LED status strip
function ledStrip() {
  // 60 × 12 mm strip; positions chosen by hand in mil (the file is in mil)
  const parts = [
    // ref, footprint, x mil, y mil, rot, layer, comment, fitted
    ['D1', 'LED-0603-HC', 550, 330, 0, 'Top', 'GREEN 570nm', 'Yes'],
    ['D2', 'LED-0603-HC', 850, 330, 0, 'Top', 'GREEN 570nm', 'Yes'],
    ['D3', 'LED-0603-HC', 1150, 330, 0, 'Top', 'AMBER 590nm', 'Yes'],
    ['D4', 'LED-0603-HC', 1450, 330, 0, 'Top', 'AMBER 590nm', 'Yes'],
    ['D5', 'LED-0603-HC', 1750, 330, 0, 'Top', 'RED 625nm', 'Yes'],
    ['D6', 'LED-0603-HC', 2050, 330, 0, 'Top', 'RED 625nm', 'Yes'],
    ['R1', 'RES-0402-HC', 550, 140, 90, 'Top', '330R', 'Yes'],
    ['R2', 'RES-0402-HC', 850, 140, 90, 'Top', '330R', 'Yes'],
    ['R3', 'RES-0402-HC', 1150, 140, 90, 'Top', '270R', 'Yes'],
    ['R4', 'RES-0402-HC', 1450, 140, 270, 'Top', '270R', 'Yes'],
    ['R5', 'RES-0402-HC', 1750, 140, 270, 'Top', '220R', 'No'],
    ['Q1', 'SOT-23-3', 2050, 150, 90, 'Top', 'NMOS-30V', 'Yes'],
    ['U1', 'SOIC-8-N', 2200, 236, 90, 'Bottom', 'LED-DRV8', 'Yes'],
    ['J1', 'CONN-2P-2.54', 100, 236, 90, 'Bottom', 'HDR 1x2', 'Yes'],
  ] as const;
  const pn: Record<string, string> = {
    'GREEN 570nm': 'HCI-D-LED-GREEN', 'AMBER 590nm': 'HCI-D-LED-AMBER', 'RED 625nm': 'HCI-D-LED-RED',
    '330R': 'HCI-R-330R', '270R': 'HCI-R-270R', '220R': 'HCI-R-220R', 'NMOS-30V': 'HCI-Q-NMOS-30V',
    'LED-DRV8': 'HCI-IC-LED-DRV8', 'HDR 1x2': 'HCI-J-0202',
  };
  const lines = [
    'Harrow Creek Instruments;LED status strip HCI-LS2 rev A;placement export',
    'Designator;Footprint;Mid X(mil);Mid Y(mil);Rotation;Layer;Comment;Part Number;Fitted',
  ];
  for (const [ref, fp, x, y, rot, layer, comment, fitted] of parts) {
    const dc = (n: number) => n.toFixed(1).replace('.', ',');
    lines.push([ref, fp, dc(x), dc(y), dc(rot), layer, comment, pn[comment], fitted].join(';'));
  }
  // 4 rows × 5 columns; columns 1 and 3 turned 180° (alternate columns)
  const cellRotations = [];
  for (let row = 0; row < 4; row++) for (const col of [1, 3]) cellRotations.push({ row, col, rotation: 180 });
  const job = {
    centroid: 'led-strip.csv',
    import: { bottomRotation: 'bottom-view' },
    board: { originX: 0, originY: 0, width: 60, height: 12 },
    panel: {
      width: 332, height: 80, flipAxis: 'vertical',
      grid: { rows: 4, cols: 5, pitchX: 64, pitchY: 16, offsetX: 8, offsetY: 10, rotation: 0, cellRotations, skip: [] },
    },
    fiducials: [
      { name: 'PT1', side: 'top', frame: 'panel', x: 4, y: 4, clearRadius: 1.0 },
      { name: 'PT2', side: 'top', frame: 'panel', x: 328, y: 4, clearRadius: 1.0 },
      { name: 'PT3', side: 'top', frame: 'panel', x: 4, y: 76, clearRadius: 1.0 },
      { name: 'PB1', side: 'bottom', frame: 'panel', x: 4, y: 5, clearRadius: 1.0 },
      { name: 'PB2', side: 'bottom', frame: 'panel', x: 328, y: 5, clearRadius: 1.0 },
      { name: 'PB3', side: 'bottom', frame: 'panel', x: 328, y: 75, clearRadius: 1.0 },
    ],
    transform: 'auto',
    library: '../library.json',
    machine: { name: 'HC line B (desktop)', reachX: 400, reachY: 400, nozzles: ['N05', 'N07', 'N10', 'N14', 'N25'] },
    program: 'led-strip',
    revision: 'A',
  };
  return { csv: lines.join('\r\n') + '\r\n', job };
}

function write(rel: string, text: string) {
  const p = join(here, rel);
  mkdirSync(dirname(p), { recursive: true });
  writeFileSync(p, text);
}

write('library.json', JSON.stringify(library, null, 2) + '\n');
const ws = weatherStation();
write('weather-station/weather-ctl.csv', ws.csv);
write('weather-station/job.json', JSON.stringify(ws.job, null, 2) + '\n');
const led = ledStrip();
write('led-strip/led-strip.csv', '\uFEFF' + led.csv);
write('led-strip/job.json', JSON.stringify(led.job, null, 2) + '\n');
// The same board with one override of each kind (names written in other letter cases on purpose:
// the engine compares library names without case, see shared/library/README.md).
const ledOverrides = {
  ...led.job,
  program: 'led-strip-substitutes',
  overrides: {
    R3: { package: 'R0603', reason: 'Buyer substituted a 0603 part for R3 (270R); the pads take either size.' },
    Q1: { nozzle: 'n10', reason: 'The N07 tip on line B is worn; N10 still fits inside the SOT-23 body.' },
    D1: { vision: 'Chip-Medium', reason: 'The green lens of D1 reflects under the chip-small lighting; centre it on the body outline.' },
  },
};
write('led-strip/job-overrides.json', JSON.stringify(ledOverrides, null, 2) + '\n');
process.stderr.write(`weather-station: ${ws.count} parts; led-strip: 14 parts\n`);
