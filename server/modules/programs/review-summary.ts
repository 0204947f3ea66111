// The review summary: what a reviewer approves, in one read. Pure functions over stored data
// (the revision, its waivers, the last released revision); ProgramService loads and calls them.
import type { ImportResult, ImportedPlacement } from '../../../shared/core';
import { everyBoardRefs, waiverLookup } from '../../../shared/review';
import { FINDING_KINDS, type Finding, type FindingKind } from '../../../shared/schemas/finding.schema';
import type { Override, ReviewSummaryDto, ReviewWaiver, RevisionChanges } from '../../../shared/schemas/program.schema';
import type { Program, ProgramRevision, RevisionWaiver } from '../../db/entities/program.entity';

/** Positions compare equal below half the lists' last decimal (3 decimals, mm and degrees). */
const POSITION_TOLERANCE = 0.0005;

const SETTINGS_SECTIONS = ['import', 'board', 'panel', 'fiducials', 'transform', 'limits', 'machine'] as const;

function placed(imported: ImportResult | null): Map<string, ImportedPlacement> {
  const out = new Map<string, ImportedPlacement>();
  for (const p of imported?.placements ?? []) if (!p.dnp) out.set(p.ref, p);
  return out;
}

/** Natural order: R2 before R10. */
const natural = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });
const sorted = (refs: Iterable<string>) => [...refs].sort(natural.compare);

/** Stable JSON (keys sorted), so equal settings compare equal whatever their key order. */
function stable(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(stable).join(',')}]`;
  if (v && typeof v === 'object') {
    const o = v as Record<string, unknown>;
    return `{${Object.keys(o)
      .filter((k) => o[k] !== undefined)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${stable(o[k])}`)
      .join(',')}}`;
  }
  return JSON.stringify(v ?? null);
}

/** What changed in the parts, settings and overrides since `base` (null: nothing released before). */
export function revisionChanges(current: Pick<ProgramRevision, 'imported' | 'settings' | 'overrides'>, base: Pick<ProgramRevision, 'id' | 'label' | 'releasedAt' | 'imported' | 'settings' | 'overrides'> | null): RevisionChanges {
  if (!base) return { since: null, added: [], removed: [], moved: [], changed: [], settings: [], overrides: [] };
  const now = placed(current.imported as unknown as ImportResult | null);
  const before = placed(base.imported as unknown as ImportResult | null);
  const added: string[] = [];
  const removed: string[] = [];
  const moved: string[] = [];
  const changed: string[] = [];
  for (const [ref, p] of now) {
    const q = before.get(ref);
    if (!q) {
      added.push(ref);
      continue;
    }
    if (p.side !== q.side || Math.abs(p.x - q.x) > POSITION_TOLERANCE || Math.abs(p.y - q.y) > POSITION_TOLERANCE || Math.abs(p.rotation - q.rotation) > POSITION_TOLERANCE) moved.push(ref);
    if (p.footprint !== q.footprint || p.value !== q.value) changed.push(ref);
  }
  for (const ref of before.keys()) if (!now.has(ref)) removed.push(ref);
  const s1 = current.settings as Record<string, unknown>;
  const s0 = base.settings as Record<string, unknown>;
  const settings = SETTINGS_SECTIONS.filter((k) => stable(s1[k]) !== stable(s0[k]));
  const o1 = current.overrides as Record<string, unknown>;
  const o0 = base.overrides as Record<string, unknown>;
  const overrides = sorted(new Set([...Object.keys(o1), ...Object.keys(o0)].filter((ref) => stable(o1[ref]) !== stable(o0[ref]))));
  return {
    since: { revisionId: base.id, label: base.label, releasedAt: base.releasedAt?.toISOString() ?? null },
    added: sorted(added),
    removed: sorted(removed),
    moved: sorted(moved),
    changed: sorted(changed),
    settings: [...settings],
    overrides,
  };
}

/** What the library gives a footprint without overrides (package, nozzle, vision preset). */
export type LibraryChoice = (footprint: string) => { package: string | null; nozzle: string | null; vision: string | null };

export function buildReviewSummary(
  r: ProgramRevision,
  program: Pick<Program, 'id' | 'name'>,
  waivers: readonly RevisionWaiver[],
  userName: (id: string) => string | null,
  changes: RevisionChanges,
  libraryChoice: LibraryChoice,
): ReviewSummaryDto {
  const findings = (r.findings as Finding[] | null) ?? null;
  const lookup = waiverLookup(waivers);
  const covers = new Map<RevisionWaiver, number>(waivers.map((w) => [w, 0]));
  const kinds = new Map<FindingKind, { severity: 'error' | 'warning'; count: number; waived: number; waivers: Set<RevisionWaiver> }>();
  let errors = 0;
  let warnings = 0;
  let waived = 0;
  let openErrors = 0;
  for (const f of findings ?? []) {
    if (f.severity === 'error') errors++;
    else warnings++;
    let k = kinds.get(f.kind);
    if (!k) kinds.set(f.kind, (k = { severity: f.severity, count: 0, waived: 0, waivers: new Set() }));
    k.count++;
    const w = lookup(f);
    if (w) {
      waived++;
      k.waived++;
      k.waivers.add(w);
      covers.set(w, (covers.get(w) ?? 0) + 1);
    } else if (f.severity === 'error') openErrors++;
  }
  const dto = (w: RevisionWaiver): ReviewWaiver => ({
    id: w.id,
    scope: w.scope === 'every-board' ? 'every-board' : 'finding',
    kind: w.kind as FindingKind,
    findingKey: w.findingKey,
    refs: w.scope === 'every-board' ? everyBoardRefs(w.findingKey) : w.findingKey.split('|').slice(1),
    reason: w.reason,
    userEmail: w.userEmail,
    userName: userName(w.userId),
    at: w.at.toISOString(),
    covers: covers.get(w) ?? 0,
  });
  const byAt = (a: RevisionWaiver, b: RevisionWaiver) => a.at.getTime() - b.at.getTime();
  const imported = r.imported as unknown as ImportResult | null;
  const footprints = new Map<string, string>();
  for (const p of imported?.placements ?? []) if (!p.dnp && !footprints.has(p.ref)) footprints.set(p.ref, p.footprint);
  const none = { package: null, nozzle: null, vision: null };
  return {
    revisionId: r.id,
    programId: program.id,
    programName: program.name,
    label: r.label,
    state: r.state,
    checkedAt: r.checkedAt?.toISOString() ?? null,
    placements: imported ? imported.placements.filter((p) => !p.dnp).length : 0,
    findings: findings ? { total: findings.length, errors, warnings, waived, openErrors } : null,
    byKind: FINDING_KINDS.filter((k) => kinds.has(k)).map((kind) => {
      const k = kinds.get(kind)!;
      return { kind, severity: k.severity, count: k.count, waived: k.waived, waivers: [...k.waivers].sort(byAt).map(dto) };
    }),
    unusedWaivers: findings ? waivers.filter((w) => (covers.get(w) ?? 0) === 0).sort(byAt).map(dto) : [],
    overrides: Object.entries(r.overrides as Record<string, Override>)
      .sort(([a], [b]) => natural.compare(a, b))
      .map(([ref, o]) => {
        const footprint = footprints.get(ref) ?? null;
        return { ref, package: o.package ?? null, nozzle: o.nozzle ?? null, vision: o.vision ?? null, reason: o.reason, footprint, instead: footprint === null ? none : libraryChoice(footprint) };
      }),
    changes,
  };
}
