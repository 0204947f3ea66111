import { useMemo } from 'react';
import { applyAffine } from '../../../../shared/geometry';
import { boardInstances, instanceAffine } from '../../../../shared/panel';
import { panelSchema } from '../../../../shared/schemas/job.schema';
import type { RevisionSettingsInput } from '../../../../shared/schemas/program.schema';
import { fixed } from '../../../lib/format';

interface Props {
  settings: RevisionSettingsInput;
  reach?: { x: number; y: number } | null;
  height?: number;
  /** write each fiducial's name beside it (the Align stage) */
  labelFiducials?: boolean;
}

/**
 * The panel to scale, top view (Y up): panel outline, board instances with their numbers and a
 * corner mark at each board's own origin (so a turned board shows which way it is turned),
 * skipped boards crossed, fiducials with their clear circles, and the machine's reach.
 * Geometry comes from shared/panel — the same step-out the engine uses.
 */
export function PanelPreview({ settings, reach, height = 360, labelFiducials: labelFids = false }: Props) {
  const model = useMemo(() => {
    const board = settings.board;
    const parsed = panelSchema.safeParse(settings.panel);
    if (!board || !parsed.success || !(board.width > 0) || !(board.height > 0)) return null;
    let instances;
    try {
      instances = boardInstances(parsed.data);
    } catch (e) {
      return { error: (e as Error).message };
    }
    const W = board.width;
    const H = board.height;
    const boards = instances.map((inst) => {
      const m = instanceAffine(inst, W, H);
      const pts = [applyAffine(m, 0, 0), applyAffine(m, W, 0), applyAffine(m, W, H), applyAffine(m, 0, H)];
      const c = applyAffine(m, W / 2, H / 2);
      const mark = [applyAffine(m, 0, 0), applyAffine(m, Math.min(W, H) * 0.18, 0), applyAffine(m, 0, Math.min(W, H) * 0.18)];
      return { inst, pts, c, mark, m };
    });
    const fids = (settings.fiducials ?? []).flatMap((f) => {
      if (f.frame === 'panel') return [{ name: f.name, side: f.side ?? 'top', x: f.x, y: f.y, r: f.clearRadius ?? 1 }];
      return boards.filter((b) => !b.inst.skipped).map((b) => {
        const p = applyAffine(b.m, f.x, f.y);
        return { name: `${f.name}/${b.inst.number}`, side: f.side ?? 'top', x: p.x, y: p.y, r: f.clearRadius ?? 1 };
      });
    });
    return { panel: parsed.data, boards, fids };
  }, [settings]);

  if (!model) return <p className="rounded border border-dashed border-ink-300 bg-white p-6 text-sm text-ink-500">Enter the board size and the panel to see it drawn to scale.</p>;
  if ('error' in model) return <p role="alert" className="rounded border border-sev-error/40 bg-sev-error/5 p-3 text-sm text-sev-error">{model.error}</p>;
  const { panel, boards, fids } = model;
  // room around the panel; more when fiducial names are written beside them
  const pad = Math.max(panel.width, panel.height) * (labelFids && fids.length ? 0.09 : 0.04);
  const maxX = Math.max(panel.width, reach?.x ?? 0);
  const maxY = Math.max(panel.height, reach?.y ?? 0);
  const showReach = reach && (reach.x < panel.width * 3 && reach.y < panel.height * 3);
  const vbW = (showReach ? maxX : panel.width) + 2 * pad;
  const vbH = (showReach ? maxY : panel.height) + 2 * pad;
  const Y = (y: number) => -y; // Y up
  const poly = (pts: { x: number; y: number }[]) => pts.map((p) => `${p.x},${Y(p.y)}`).join(' ');
  const font = Math.max(panel.width, panel.height) / 40;
  return (
    <figure className="rounded border border-ink-200 bg-ink-950 p-2">
      <svg role="img" aria-label={`Panel ${fixed(panel.width)} × ${fixed(panel.height)} mm with ${boards.length} boards${fids.length ? ` and ${fids.length} fiducial${fids.length === 1 ? '' : 's'} (${fids.map((f) => f.name).join(', ')})` : ''}`} viewBox={`${-pad} ${-(showReach ? maxY : panel.height) - pad} ${vbW} ${vbH}`} style={{ width: '100%', height }} preserveAspectRatio="xMidYMid meet">
        {showReach && reach && <rect x={0} y={Y(reach.y)} width={reach.x} height={reach.y} fill="none" stroke="#3f88c5" strokeDasharray={`${font / 2} ${font / 3}`} strokeWidth={font / 12} />}
        <rect x={0} y={Y(panel.height)} width={panel.width} height={panel.height} fill="#1d5c3d" fillOpacity={0.35} stroke="#a9b6c0" strokeWidth={font / 10} />
        {boards.map((b) => (
          <g key={b.inst.number}>
            <polygon points={poly(b.pts)} fill={b.inst.skipped ? 'none' : '#23744c'} fillOpacity={0.55} stroke={b.inst.skipped ? '#7d8e9c' : '#4fae7a'} strokeWidth={font / 10} strokeDasharray={b.inst.skipped ? `${font / 3} ${font / 4}` : undefined} />
            {b.inst.skipped && (
              <>
                <line x1={b.pts[0].x} y1={Y(b.pts[0].y)} x2={b.pts[2].x} y2={Y(b.pts[2].y)} stroke="#7d8e9c" strokeWidth={font / 12} />
                <line x1={b.pts[1].x} y1={Y(b.pts[1].y)} x2={b.pts[3].x} y2={Y(b.pts[3].y)} stroke="#7d8e9c" strokeWidth={font / 12} />
              </>
            )}
            <polygon points={poly(b.mark)} fill="#dc8444" />
            <text x={b.c.x} y={Y(b.c.y)} fontSize={font * 1.4} fill="#f5f7f8" textAnchor="middle" dominantBaseline="middle" fontFamily="Roboto Mono, monospace">
              {b.inst.number}{b.inst.rotation ? ` ↻${b.inst.rotation}°` : ''}
            </text>
          </g>
        ))}
        {fids.map((f) => (
          <g key={`${f.side}-${f.name}`} data-fiducial={f.name}>
            <circle cx={f.x} cy={Y(f.y)} r={f.r} fill="none" stroke={f.side === 'top' ? '#e7a46c' : '#cdd5db'} strokeWidth={font / 14} strokeDasharray={f.side === 'bottom' ? `${font / 5} ${font / 6}` : undefined} />
            <circle cx={f.x} cy={Y(f.y)} r={Math.min(f.r / 2, 0.5)} fill={f.side === 'top' ? '#e7a46c' : '#cdd5db'} />
            {labelFids && (
              <text x={f.x + f.r + font * 0.3} y={Y(f.y)} fontSize={font * 1.5} fill={f.side === 'top' ? '#e7a46c' : '#cdd5db'} dominantBaseline="middle" fontFamily="Roboto Mono, monospace">
                {f.name}
              </text>
            )}
          </g>
        ))}
      </svg>
      <figcaption className="mt-1 flex flex-wrap gap-4 px-1 text-2xs text-ink-300">
        <span>Top view, Y up · copper corner = each board's own origin</span>
        <span className="num">panel {fixed(panel.width)} × {fixed(panel.height)} mm</span>
        {reach && <span className="num text-[#3f88c5]">machine reach {fixed(reach.x)} × {fixed(reach.y)} mm (dashed)</span>}
        <span>○ fiducial clear area (top solid, bottom dashed)</span>
      </figcaption>
    </figure>
  );
}
