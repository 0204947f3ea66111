import { useMemo, useRef } from 'react';
import { toast } from 'sonner';
import type { RunResult, Side } from '../../../../shared/core';
import type { RevisionDetail, Underlay } from '../../../../shared/schemas/program.schema';
import { ErrorPanel, ProgressBar } from '../../../components/ui/misc';
import { PanelReview, type CanvasNote, type UnderlayState } from '../../canvas';
import { useAddComment, useRun, useSaveUnderlay, useUnderlays } from '../api/programs';

function readDataUrl(file: File): Promise<string> {
  return new Promise((resolve, reject) => {
    const fr = new FileReader();
    fr.onload = () => resolve(String(fr.result));
    fr.onerror = () => reject(fr.error);
    fr.readAsDataURL(file);
  });
}

/**
 * The canvas overlay for a revision: both sides as the engine computes them, its findings, the
 * review's pinned comments and checked marks, and the image underlays — persisted on the server.
 */
export function RevisionCanvas({ r, height = 560, showFinding }: { r: RevisionDetail; height?: number; showFinding?: { key: string; seq: number } | null }) {
  const hasBottom = !!r.imported && r.imported.bottom > 0;
  // A new version (a check, a waiver, a comment) keeps the drawing on screen while the engine runs
  // again: no loading bar in its place, so the page neither jumps nor rebuilds the canvas twice.
  const top = useRun(r.id, 'top', r.version, true, true);
  const bottom = useRun(r.id, 'bottom', r.version, hasBottom, true);
  const underlays = useUnderlays(r.id);
  const saveUnderlay = useSaveUnderlay(r.id);
  const addComment = useAddComment(r.id);
  const open = r.state === 'draft' || r.state === 'in-review';

  const runs = useMemo(() => {
    const out: Partial<Record<Side, RunResult>> = {};
    if (top.data) out.top = top.data;
    if (hasBottom && bottom.data) out.bottom = bottom.data;
    return out;
  }, [top.data, bottom.data, hasBottom]);

  const notes: CanvasNote[] = useMemo(
    () => r.comments.filter((c) => c.kind === 'comment' && c.x !== null && c.y !== null).map((c) => ({ id: c.id, side: c.side, x: c.x!, y: c.y!, text: c.text, author: c.userEmail, createdAt: c.at })),
    [r.comments],
  );
  const checked = useMemo(() => {
    const s = new Set<string>();
    for (const c of r.comments) if (c.kind === 'checked' && c.findingKey) (c.text === 'unchecked' ? s.delete(c.findingKey) : s.add(c.findingKey));
    return s;
  }, [r.comments]);

  const underlayStates = useMemo(() => {
    const out: Partial<Record<Side, UnderlayState | null>> = {};
    for (const side of ['top', 'bottom'] as const) {
      const u = underlays.data?.[side];
      out[side] = u ? { side, url: u.dataUrl, name: u.name, width: u.width, height: u.height, transform: u.transform, opacity: u.opacity } : null;
    }
    return out;
  }, [underlays.data]);

  // placeholder runs are only this revision's earlier version, never another revision's
  const shownFor = useRef(r.id);
  if (!top.isPlaceholderData && top.data) shownFor.current = r.id;
  const otherRevision = top.isPlaceholderData && shownFor.current !== r.id;

  if (top.isPending || (hasBottom && bottom.isPending) || otherRevision) return <ProgressBar label="Drawing the panel" />;
  if (top.isError) return <ErrorPanel error={top.error} />;

  return (
    <PanelReview
      runs={runs}
      findings={r.findings ?? []}
      comments={notes}
      checkedFindingKeys={checked}
      canvasHeight={height}
      showFinding={showFinding}
      onAddComment={open ? (n) => addComment.mutate({ side: n.side, kind: 'comment', x: n.x, y: n.y, findingKey: null, text: n.text }, { onError: (e) => toast.error(e.message) }) : undefined}
      onToggleChecked={
        open
          ? (keys, isChecked) => {
              for (const k of keys) addComment.mutate({ side: r.findings?.find((f) => f.key === k)?.side ?? 'top', kind: 'checked', x: null, y: null, findingKey: k, text: isChecked ? 'checked' : 'unchecked' }, { onError: (e) => toast.error(e.message) });
            }
          : undefined
      }
      underlays={underlayStates}
      onUnderlayChange={
        open
          ? async (side, u, file) => {
              if (!u) return saveUnderlay.mutate({ side, underlay: null }, { onError: (e) => toast.error(e.message) });
              const dataUrl = file ? await readDataUrl(file) : underlays.data?.[side]?.dataUrl;
              if (!dataUrl) return;
              const body: Underlay = { dataUrl, name: u.name, width: u.width, height: u.height, transform: u.transform, opacity: u.opacity };
              saveUnderlay.mutate({ side, underlay: body }, { onError: (e) => toast.error(e.message) });
            }
          : undefined
      }
    />
  );
}
