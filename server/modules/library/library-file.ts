// The whole library ⇄ the library file ("placewright-library/1", shared/schemas/README.md). The
// export is canonical:
// fixed key order, things sorted by their lower-cased name, optional keys left out when empty, so
// export → import → export gives the same bytes.
import type { LibraryAlias } from '../../db/entities/library-alias.entity';
import type { LibraryMachine } from '../../db/entities/library-machine.entity';
import type { LibraryNozzle } from '../../db/entities/library-nozzle.entity';
import type { LibraryPackage } from '../../db/entities/library-package.entity';
import type { LibraryVisionPreset } from '../../db/entities/library-vision-preset.entity';
import {
  createPackageInputSchema,
  DEFAULT_COURTYARD_MM,
  FEEDER_KINDS,
  LIGHTINGS,
  machineInputSchema,
  nozzleInputSchema,
  PACKAGE_FAMILIES,
  VISION_METHODS,
  visionPresetInputSchema,
  type CreatePackageInput,
  type MachineInput,
  type NozzleInput,
  type VisionPresetInput,
} from '../../../shared/schemas/library.schema';
import { libraryFileSchema } from '../../../shared/schemas/library-file.schema';
import type { FieldError } from '../../lib/errors';

export const LIBRARY_FORMAT = 'placewright-library/1';

const byKey = (a: string, b: string) => {
  const ka = a.toLowerCase();
  const kb = b.toLowerCase();
  return ka < kb ? -1 : ka > kb ? 1 : a < b ? -1 : a > b ? 1 : 0;
};

export interface LibraryRows {
  packages: LibraryPackage[];
  aliases: LibraryAlias[];
  nozzles: LibraryNozzle[];
  presets: LibraryVisionPreset[];
  machines: LibraryMachine[];
}

/** The canonical library file object (keys in this order). */
export function toLibraryFileObject(rows: LibraryRows): Record<string, unknown> {
  const aliasesOf = new Map<string, string[]>();
  for (const a of rows.aliases) {
    const list = aliasesOf.get(a.packageId) ?? [];
    list.push(a.pattern);
    aliasesOf.set(a.packageId, list);
  }
  const notes = (n: string) => (n ? { notes: n } : {});
  return {
    format: LIBRARY_FORMAT,
    packages: [...rows.packages]
      .sort((a, b) => byKey(a.name, b.name))
      .map((p) => {
        const pads: Record<string, number> = {};
        if (p.padLength != null) pads.length = p.padLength;
        if (p.padWidth != null) pads.width = p.padWidth;
        if (p.padCount != null) pads.count = p.padCount;
        return {
          name: p.name,
          aliases: (aliasesOf.get(p.id) ?? []).sort(byKey),
          family: p.family,
          body: { length: p.bodyLength, width: p.bodyWidth, height: p.bodyHeight, offsetX: p.offsetX, offsetY: p.offsetY },
          courtyard: p.courtyard,
          rotationOffset: p.rotationOffset,
          polarised: p.polarised,
          overhang: p.overhang,
          nozzles: [...p.nozzles],
          ...(p.vision ? { vision: p.vision } : {}),
          ...(p.tapeWidth != null && p.tapePitch != null ? { tape: { width: p.tapeWidth, pitch: p.tapePitch } } : {}),
          feeder: p.feeder,
          ...(Object.keys(pads).length ? { pads } : {}),
          ...notes(p.notes),
        };
      }),
    nozzles: [...rows.nozzles]
      .sort((a, b) => byKey(a.name, b.name))
      .map((n) => ({ name: n.name, tipOuter: n.tipOuter, ...(n.tipInner != null ? { tipInner: n.tipInner } : {}), holderRadius: n.holderRadius, ...notes(n.notes) })),
    visionPresets: [...rows.presets]
      .sort((a, b) => byKey(a.name, b.name))
      .map((v) => ({
        name: v.name,
        method: v.method,
        lighting: v.lighting,
        sizeTolerancePct: v.sizeTolerancePct,
        maxCentringOffset: v.maxCentringOffset,
        maxAngleCorrection: v.maxAngleCorrection,
        ...notes(v.notes),
      })),
    machines: [...rows.machines]
      .sort((a, b) => byKey(a.name, b.name))
      .map((m) => ({ name: m.name, reachX: m.reachX, reachY: m.reachY, nozzles: [...m.nozzles], maxPartHeight: m.maxPartHeight, ...notes(m.notes) })),
  };
}

export function toLibraryFileText(rows: LibraryRows): string {
  return JSON.stringify(toLibraryFileObject(rows), null, 2) + '\n';
}

// ---- reading a library file

export interface ParsedLibrary {
  packages: CreatePackageInput[];
  nozzles: NozzleInput[];
  presets: VisionPresetInput[];
  machines: MachineInput[];
}

/** Defaults for vision preset fields a plain engine library file does not carry (the demo's own). */
export const PRESET_DEFAULTS = { lighting: 'top', sizeTolerancePct: 10, maxCentringOffset: 0.5, maxAngleCorrection: 5 } as const;

const FILE_PATH: Record<string, string> = {
  bodyLength: 'body.length',
  bodyWidth: 'body.width',
  bodyHeight: 'body.height',
  offsetX: 'body.offsetX',
  offsetY: 'body.offsetY',
  tapeWidth: 'tape.width',
  tapePitch: 'tape.pitch',
  padLength: 'pads.length',
  padWidth: 'pads.width',
  padCount: 'pads.count',
};

const isObj = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const str = (v: unknown) => (typeof v === 'string' ? v : undefined);

function issuesOf(prefix: string, error: { issues: { path: PropertyKey[]; message: string }[] }, map: Record<string, string> = {}): FieldError[] {
  return error.issues.map((i) => {
    const [head, ...rest] = i.path.map(String);
    const mapped = head === undefined ? '' : (map[head] ?? head);
    return { path: [prefix, mapped, ...rest].filter(Boolean).join('.'), message: i.message };
  });
}

/**
 * Reads a library file into validated inputs; collects every problem with its path in the file
 * (`packages.3.tape.pitch`). The file is read by the engine's one reader of the format
 * (`libraryFileSchema`, shared/schemas/README.md "Library file"); the parsed packages, nozzles and
 * presets (their extra keys kept: family, feeder, pads, notes, lighting, machines) are then mapped
 * to the library's rows and checked against the library's own, stricter rules (EIA-481 tape
 * pairs, families, preset methods). References (nozzles, vision presets) are checked by the caller.
 */
export function parseLibraryFile(input: unknown): { value: ParsedLibrary; errors: FieldError[] } {
  const errors: FieldError[] = [];
  const value: ParsedLibrary = { packages: [], nozzles: [], presets: [], machines: [] };
  if (!isObj(input)) return { value, errors: [{ path: '(root)', message: 'A library file is a JSON object' }] };
  const read = libraryFileSchema.safeParse(input);
  if (!read.success) {
    for (const i of read.error.issues) errors.push({ path: i.path.length ? i.path.map(String).join('.') : '(root)', message: i.path[0] === 'format' ? `Expected "${LIBRARY_FORMAT}"` : i.message });
  }
  // the parsed file when it reads (defaults filled in); else the raw one, so that the library's own
  // rules still report every problem in one answer
  const file: Record<string, unknown> = read.success ? (read.data as Record<string, unknown>) : input;
  const list = (key: string, required: boolean): unknown[] => {
    const v = file[key];
    if (v === undefined && !required) return [];
    if (!Array.isArray(v)) {
      errors.push({ path: key, message: 'Expected a list' });
      return [];
    }
    return v;
  };

  list('packages', true).forEach((raw, i) => {
    const at = `packages.${i}`;
    if (!isObj(raw)) return errors.push({ path: at, message: 'Expected an object' });
    const body = isObj(raw.body) ? raw.body : {};
    if (!isObj(raw.body)) errors.push({ path: `${at}.body`, message: 'Expected { length, width, height }' });
    const tape = isObj(raw.tape) ? raw.tape : null;
    const pads = isObj(raw.pads) ? raw.pads : null;
    const family = str(raw.family) ?? 'other';
    const candidate = {
      name: raw.name,
      family: (PACKAGE_FAMILIES as readonly string[]).includes(family) ? family : family,
      bodyLength: body.length,
      bodyWidth: body.width,
      bodyHeight: body.height,
      offsetX: body.offsetX ?? 0,
      offsetY: body.offsetY ?? 0,
      courtyard: raw.courtyard ?? DEFAULT_COURTYARD_MM,
      rotationOffset: raw.rotationOffset ?? 0,
      polarised: raw.polarised ?? false,
      overhang: raw.overhang ?? false,
      nozzles: raw.nozzles ?? [],
      vision: raw.vision ?? null,
      tapeWidth: tape ? tape.width : null,
      tapePitch: tape ? tape.pitch : null,
      feeder: raw.feeder ?? (FEEDER_KINDS as readonly string[])[0],
      padLength: pads?.length ?? null,
      padWidth: pads?.width ?? null,
      padCount: pads?.count ?? null,
      notes: str(raw.notes) ?? str(raw.source) ?? '',
      aliases: raw.aliases ?? [],
    };
    const r = createPackageInputSchema.safeParse(candidate);
    if (r.success) value.packages.push(r.data);
    else errors.push(...issuesOf(at, r.error, FILE_PATH));
  });

  list('nozzles', false).forEach((raw, i) => {
    const at = `nozzles.${i}`;
    if (!isObj(raw)) return errors.push({ path: at, message: 'Expected an object' });
    const r = nozzleInputSchema.safeParse({ name: raw.name, tipOuter: raw.tipOuter, tipInner: raw.tipInner ?? null, holderRadius: raw.holderRadius, notes: str(raw.notes) ?? '' });
    if (r.success) value.nozzles.push(r.data);
    else errors.push(...issuesOf(at, r.error));
  });

  list('visionPresets', false).forEach((raw, i) => {
    const at = `visionPresets.${i}`;
    if (!isObj(raw)) return errors.push({ path: at, message: 'Expected an object' });
    const r = visionPresetInputSchema.safeParse({
      name: raw.name,
      method: raw.method,
      lighting: raw.lighting ?? PRESET_DEFAULTS.lighting,
      sizeTolerancePct: raw.sizeTolerancePct ?? PRESET_DEFAULTS.sizeTolerancePct,
      maxCentringOffset: raw.maxCentringOffset ?? PRESET_DEFAULTS.maxCentringOffset,
      maxAngleCorrection: raw.maxAngleCorrection ?? PRESET_DEFAULTS.maxAngleCorrection,
      notes: str(raw.notes) ?? '',
    });
    if (r.success) value.presets.push(r.data);
    else
      errors.push(
        ...issuesOf(at, r.error).map((e) =>
          e.path === `${at}.method` ? { ...e, message: `Use one of ${VISION_METHODS.join(', ')}` } : e.path === `${at}.lighting` ? { ...e, message: `Use one of ${LIGHTINGS.join(', ')}` } : e,
        ),
      );
  });

  list('machines', false).forEach((raw, i) => {
    const at = `machines.${i}`;
    if (!isObj(raw)) return errors.push({ path: at, message: 'Expected an object' });
    const r = machineInputSchema.safeParse({ name: raw.name, reachX: raw.reachX, reachY: raw.reachY, nozzles: raw.nozzles ?? [], maxPartHeight: raw.maxPartHeight, notes: str(raw.notes) ?? '' });
    if (r.success) value.machines.push(r.data);
    else errors.push(...issuesOf(at, r.error));
  });

  // one problem per place: the format reader's message first
  const seen = new Set<string>();
  return { value, errors: errors.filter((e) => (seen.has(e.path) ? false : (seen.add(e.path), true))) };
}
