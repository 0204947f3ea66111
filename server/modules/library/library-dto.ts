// The library's rows as the API answers them (DTOs), the snapshots a revision keeps, and the
// optimistic-locking conflict every edit of the library raises.
import {
  isPattern,
  packageWarnings,
  type AliasDto,
  type LibraryEntityKind,
  type MachineDto,
  type NozzleDto,
  type PackageDto,
  type RevisionDto,
  type VisionPresetDto,
} from '../../../shared/schemas/library.schema';
import type { LibraryAlias } from '../../db/entities/library-alias.entity';
import type { LibraryMachine } from '../../db/entities/library-machine.entity';
import type { LibraryNozzle } from '../../db/entities/library-nozzle.entity';
import type { LibraryPackage } from '../../db/entities/library-package.entity';
import type { LibraryRevision } from '../../db/entities/library-revision.entity';
import type { LibraryVisionPreset } from '../../db/entities/library-vision-preset.entity';
import { ConflictError } from '../../lib/errors';

const iso = (d: Date) => d.toISOString();

export function packageSnapshot(p: LibraryPackage, aliases: string[] = []): Record<string, unknown> {
  return {
    name: p.name, family: p.family, bodyLength: p.bodyLength, bodyWidth: p.bodyWidth, bodyHeight: p.bodyHeight,
    offsetX: p.offsetX, offsetY: p.offsetY, courtyard: p.courtyard, rotationOffset: p.rotationOffset,
    polarised: p.polarised, overhang: p.overhang, nozzles: [...p.nozzles], vision: p.vision,
    tapeWidth: p.tapeWidth, tapePitch: p.tapePitch, feeder: p.feeder, padLength: p.padLength,
    padWidth: p.padWidth, padCount: p.padCount, notes: p.notes, aliases, version: p.version,
  };
}

export function toPackageDto(p: LibraryPackage, aliases: LibraryAlias[], nozzles: LibraryNozzle[]): PackageDto {
  const snap = packageSnapshot(p) as Omit<PackageDto, 'id' | 'aliases' | 'warnings' | 'updatedAt' | 'updatedBy'>;
  return {
    ...snap,
    id: p.id,
    version: p.version,
    updatedAt: iso(p.updatedAt),
    updatedBy: p.updatedBy,
    aliases: aliases.map((a) => ({ id: a.id, pattern: a.pattern, version: a.version })),
    warnings: packageWarnings(p, nozzles),
  };
}

export const toNozzleDto = (n: LibraryNozzle): NozzleDto => ({
  id: n.id, name: n.name, tipOuter: n.tipOuter, tipInner: n.tipInner, holderRadius: n.holderRadius, notes: n.notes,
  version: n.version, updatedAt: iso(n.updatedAt), updatedBy: n.updatedBy,
});
export const toPresetDto = (v: LibraryVisionPreset): VisionPresetDto => ({
  id: v.id, name: v.name, method: v.method, lighting: v.lighting, sizeTolerancePct: v.sizeTolerancePct,
  maxCentringOffset: v.maxCentringOffset, maxAngleCorrection: v.maxAngleCorrection, notes: v.notes,
  version: v.version, updatedAt: iso(v.updatedAt), updatedBy: v.updatedBy,
});
export const toMachineDto = (m: LibraryMachine): MachineDto => ({
  id: m.id, name: m.name, reachX: m.reachX, reachY: m.reachY, nozzles: [...m.nozzles], maxPartHeight: m.maxPartHeight,
  notes: m.notes, version: m.version, updatedAt: iso(m.updatedAt), updatedBy: m.updatedBy,
});
export const toAliasDto = (a: LibraryAlias, pkgName: string): AliasDto => ({
  id: a.id, pattern: a.pattern, isPattern: isPattern(a.pattern), packageId: a.packageId, packageName: pkgName,
  version: a.version, updatedAt: iso(a.updatedAt), updatedBy: a.updatedBy,
});
export function toRevisionDto(r: LibraryRevision): RevisionDto {
  return {
    id: String(r.id), at: iso(r.at), actorEmail: r.actorEmail, entity: r.entity as LibraryEntityKind, entityId: r.entityId,
    entityName: r.entityName, action: r.action, before: r.before, after: r.after,
  };
}

/** Aliases by package id, each list sorted by pattern. */
export function groupAliases(aliases: LibraryAlias[]): Map<string, LibraryAlias[]> {
  const map = new Map<string, LibraryAlias[]>();
  for (const a of [...aliases].sort((x, y) => (x.patternKey < y.patternKey ? -1 : 1))) {
    const list = map.get(a.packageId) ?? [];
    list.push(a);
    map.set(a.packageId, list);
  }
  return map;
}

export function conflict(what: string, seen: number, now: number): ConflictError {
  return new ConflictError(
    `${what} was changed by someone else since you opened it (your version ${seen}, now ${now}). Nothing was saved and nothing of theirs was lost: reload to see their change, then make yours again — your edits stay in the form.`,
  );
}
