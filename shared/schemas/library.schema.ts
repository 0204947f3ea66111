// The package library's API schemas: packages, footprint aliases, nozzles, vision
// presets, machine profiles, proposals, the unmatched-footprints queue and revisions. zod 4.
// Shared by the server (validate) and the client (forms, response parsing).
import { z } from 'zod';
import { lengthText } from '../core';
import { DEFAULT_COURTYARD } from '../library';

export const PACKAGE_FAMILIES = ['chip', 'MELF', 'SOD', 'SOT', 'SOIC', 'SSOP/TSSOP', 'QFN/DFN', 'QFP', 'BGA', 'electrolytic', 'crystal', 'connector', 'other'] as const;
export type PackageFamily = (typeof PACKAGE_FAMILIES)[number];
export const FEEDER_KINDS = ['tape', 'strip', 'tray', 'tube'] as const;
export type FeederKind = (typeof FEEDER_KINDS)[number];
/** Carrier tape widths, mm (EIA-481, from memory). */
export const TAPE_WIDTHS = [8, 12, 16, 24, 32, 44, 56, 72] as const;
/** Our own vision preset methods: how the up-looking camera centres a part. */
export const VISION_METHODS = ['body-outline', 'lead-tips', 'ball-grid', 'corner-edges', 'none'] as const;
export type VisionMethod = (typeof VISION_METHODS)[number];
export const VISION_METHOD_LABELS: Record<VisionMethod, string> = {
  'body-outline': 'Body outline',
  'lead-tips': 'Lead tips',
  'ball-grid': 'Ball grid',
  'corner-edges': 'Corner edges',
  none: 'None',
};
export const LIGHTINGS = ['top', 'side', 'both'] as const;
export type Lighting = (typeof LIGHTINGS)[number];
/** IPC-7351B density level B courtyard excess, mm (from memory). */
export const DEFAULT_COURTYARD_MM = DEFAULT_COURTYARD; // one value: the engine's (shared/library)

const EPS = 1e-9;

/** Why a tape width / pocket pitch pair is not EIA-481, or null when it is (shared/README.md, "Check values and their sources"). */
export function tapeProblem(width: number | null, pitch: number | null): { path: 'tapeWidth' | 'tapePitch'; message: string } | null {
  if (width == null && pitch == null) return null;
  if (width == null) return { path: 'tapeWidth', message: 'Give the tape width too, or clear the pocket pitch' };
  if (pitch == null) return { path: 'tapePitch', message: 'Give the pocket pitch too, or clear the tape width' };
  if (!(TAPE_WIDTHS as readonly number[]).includes(width)) return { path: 'tapeWidth', message: `${width} mm is not a carrier tape width; use ${TAPE_WIDTHS.join(', ')} mm` };
  if (Math.abs(pitch - 2) < EPS) return width === 8 ? null : { path: 'tapePitch', message: `A 2 mm pocket pitch exists only on 8 mm tape; ${width} mm tape uses multiples of 4 mm` };
  const k = pitch / 4;
  if (pitch > 0 && Math.abs(k - Math.round(k)) < EPS) return null;
  return { path: 'tapePitch', message: `Pocket pitch ${pitch} mm does not suit ${width} mm tape: use ${width === 8 ? '2 mm or ' : ''}a multiple of 4 mm` };
}

const GLOB = /[*?]/;
export const isPattern = (s: string) => GLOB.test(s);

const name = (what: string, max = 100) =>
  z.string().trim().min(1, `Enter a ${what} name`).max(max, `At most ${max} characters`);
const mm = (what: string) => z.number({ error: `Enter the ${what} in mm` }).finite().positive(`The ${what} must be more than 0 mm`).max(1000, 'At most 1000 mm');
const offset = (what: string) => z.number({ error: `Enter the ${what} in mm (0 when centred)` }).finite().min(-500).max(500);
const optPositive = (what: string, max = 1000) => z.number({ error: `Enter the ${what}, or leave it empty` }).finite().positive(`The ${what} must be more than 0`).max(max).nullable();

export const aliasPatternSchema = z
  .string()
  .trim()
  .min(1, 'Enter a footprint name or a pattern')
  .max(200, 'At most 200 characters')
  .refine((s) => !/^[*?]+$/.test(s), 'A pattern of only * and ? would match every footprint');

/** The editable fields of a package, flat (as in the form and the CSV). */
const packageFields = z.object({
  name: name('package').refine((s) => !GLOB.test(s), 'A package name cannot contain * or ? (those are for alias patterns)'),
  family: z.enum(PACKAGE_FAMILIES, { error: 'Choose a family' }),
  bodyLength: mm('body length'),
  bodyWidth: mm('body width'),
  bodyHeight: mm('body height'),
  offsetX: offset('body offset X'),
  offsetY: offset('body offset Y'),
  courtyard: z.number({ error: 'Enter the courtyard excess in mm' }).finite().min(0, 'The courtyard excess cannot be negative').max(10, 'At most 10 mm'),
  rotationOffset: z.number({ error: 'Enter the rotation offset in degrees' }).finite().gt(-360, 'Between −360° and 360°').lt(360, 'Between −360° and 360°'),
  polarised: z.boolean(),
  overhang: z.boolean(),
  /** Nozzles that may lift it, preferred first. */
  nozzles: z.array(z.string().trim().min(1)).max(20).refine((a) => new Set(a).size === a.length, 'A nozzle is listed twice'),
  vision: z.string().trim().min(1).nullable(),
  tapeWidth: z.number().finite().nullable(),
  tapePitch: z.number().finite().nullable(),
  feeder: z.enum(FEEDER_KINDS, { error: 'Choose a feeder kind' }),
  padLength: optPositive('pad length', 100),
  padWidth: optPositive('pad width', 100),
  padCount: z.number().int('A whole number of pads').positive('At least 1 pad').max(10000).nullable(),
  notes: z.string().max(2000, 'At most 2000 characters'),
});

type PackageFieldValues = z.infer<typeof packageFields>;

function checkPackage(p: Pick<PackageFieldValues, 'tapeWidth' | 'tapePitch'>, ctx: z.RefinementCtx) {
  const t = tapeProblem(p.tapeWidth, p.tapePitch);
  if (t) ctx.addIssue({ code: 'custom', path: [t.path], message: t.message });
}

export const packageInputSchema = packageFields.superRefine(checkPackage);
export type PackageInput = z.infer<typeof packageInputSchema>;
export const createPackageInputSchema = packageFields.extend({ aliases: z.array(aliasPatternSchema).max(50) }).superRefine(checkPackage);
export type CreatePackageInput = z.infer<typeof createPackageInputSchema>;
export const updatePackageInputSchema = packageFields.extend({ version: z.number().int().min(1) }).superRefine(checkPackage);
export type UpdatePackageInput = z.infer<typeof updatePackageInputSchema>;

/** A blank package with the defaults a librarian starts from. */
export function blankPackage(nameValue = ''): CreatePackageInput {
  return {
    name: nameValue, family: 'chip', bodyLength: 1.6, bodyWidth: 0.8, bodyHeight: 0.5, offsetX: 0, offsetY: 0,
    courtyard: DEFAULT_COURTYARD_MM, rotationOffset: 0, polarised: false, overhang: false, nozzles: [], vision: null,
    tapeWidth: 8, tapePitch: 4, feeder: 'tape', padLength: null, padWidth: null, padCount: null, notes: '', aliases: [],
  };
}

/**
 * Advice that does not block saving (common practice): a nozzle tip wider than
 * the body's smaller side may not seal on the part. Unknown nozzles are errors, checked elsewhere.
 */
export function packageWarnings(
  p: Pick<PackageFieldValues, 'bodyLength' | 'bodyWidth' | 'nozzles'>,
  nozzles: readonly { name: string; tipOuter: number }[],
): { path: string; message: string }[] {
  const out: { path: string; message: string }[] = [];
  const side = Math.min(p.bodyLength, p.bodyWidth);
  p.nozzles.forEach((n, i) => {
    const nz = nozzles.find((x) => x.name === n);
    if (nz && Number.isFinite(side) && nz.tipOuter > side + EPS) {
      out.push({ path: `nozzles.${i}`, message: `Nozzle ${n}'s tip (${lengthText(nz.tipOuter)}) is wider than the body's smaller side (${lengthText(side)}): it may not seal on the part` });
    }
  });
  return out;
}

const meta = {
  id: z.string().uuid(),
  version: z.number().int(),
  updatedAt: z.string(),
  updatedBy: z.string().nullable(),
};

export const aliasRefSchema = z.object({ id: z.string().uuid(), pattern: z.string(), version: z.number().int() });
export const packageSchema = packageFields.extend({
  ...meta,
  aliases: z.array(aliasRefSchema),
  warnings: z.array(z.object({ path: z.string(), message: z.string() })),
});
export type PackageDto = z.infer<typeof packageSchema>;

// ---- aliases
export const aliasInputSchema = z.object({ pattern: aliasPatternSchema, packageId: z.string().uuid('Choose a package') });
export type AliasInput = z.infer<typeof aliasInputSchema>;
export const updateAliasInputSchema = aliasInputSchema.extend({ version: z.number().int().min(1) });
export type UpdateAliasInput = z.infer<typeof updateAliasInputSchema>;
export const aliasSchema = z.object({ ...meta, pattern: z.string(), isPattern: z.boolean(), packageId: z.string().uuid(), packageName: z.string() });
export type AliasDto = z.infer<typeof aliasSchema>;

// ---- nozzles
export const nozzleInputSchema = z
  .object({
    name: name('nozzle', 40),
    tipOuter: mm('tip outer diameter'),
    tipInner: z.number({ error: 'Enter the inner diameter, or leave it empty' }).finite().min(0).max(100).nullable(),
    holderRadius: mm('holder radius'),
    notes: z.string().max(2000),
  })
  .superRefine((n, ctx) => {
    if (n.tipInner != null && n.tipInner >= n.tipOuter) ctx.addIssue({ code: 'custom', path: ['tipInner'], message: 'The inner diameter must be smaller than the outer one' });
    if (n.holderRadius * 2 < n.tipOuter) ctx.addIssue({ code: 'custom', path: ['holderRadius'], message: 'The holder is narrower than its own tip' });
  });
export type NozzleInput = z.infer<typeof nozzleInputSchema>;
export const nozzleSchema = z.object({ ...meta, name: z.string(), tipOuter: z.number(), tipInner: z.number().nullable(), holderRadius: z.number(), notes: z.string() });
export type NozzleDto = z.infer<typeof nozzleSchema>;

// ---- vision presets
export const visionPresetInputSchema = z.object({
  name: name('preset', 60),
  method: z.enum(VISION_METHODS, { error: 'Choose a method' }),
  lighting: z.enum(LIGHTINGS, { error: 'Choose the lighting' }),
  sizeTolerancePct: z.number({ error: 'Enter a tolerance in %' }).finite().min(0, 'At least 0 %').max(100, 'At most 100 %'),
  maxCentringOffset: z.number({ error: 'Enter a distance in mm' }).finite().min(0, 'At least 0 mm').max(20, 'At most 20 mm'),
  maxAngleCorrection: z.number({ error: 'Enter an angle in degrees' }).finite().min(0, 'At least 0°').max(180, 'At most 180°'),
  notes: z.string().max(2000),
});
export type VisionPresetInput = z.infer<typeof visionPresetInputSchema>;
export const visionPresetSchema = visionPresetInputSchema.extend(meta);
export type VisionPresetDto = z.infer<typeof visionPresetSchema>;

// ---- machine profiles
export const machineInputSchema = z.object({
  name: name('machine', 60),
  reachX: mm('reach X'),
  reachY: mm('reach Y'),
  nozzles: z.array(z.string().trim().min(1)).max(50).refine((a) => new Set(a).size === a.length, 'A nozzle is listed twice'),
  maxPartHeight: mm('maximum part height'),
  notes: z.string().max(2000),
});
export type MachineInput = z.infer<typeof machineInputSchema>;
export const machineSchema = machineInputSchema.extend(meta);
export type MachineDto = z.infer<typeof machineSchema>;

/** Every update of a named thing carries the version the editor saw. */
export const withVersion = <S extends z.ZodObject>(s: S) => s.extend({ version: z.number().int().min(1) });
export const updateNozzleInputSchema = z.intersection(nozzleInputSchema, z.object({ version: z.number().int().min(1) }));
export type UpdateNozzleInput = z.infer<typeof updateNozzleInputSchema>;
export const updateVisionPresetInputSchema = withVersion(visionPresetInputSchema);
export const updateMachineInputSchema = withVersion(machineInputSchema);
export const deleteInputSchema = z.object({ version: z.number({ error: 'Send the version you saw' }).int().min(1) });

// ---- revisions
export const LIBRARY_ENTITIES = ['package', 'alias', 'nozzle', 'vision-preset', 'machine', 'library'] as const;
export type LibraryEntityKind = (typeof LIBRARY_ENTITIES)[number];
export const revisionSchema = z.object({
  id: z.string(),
  at: z.string(),
  actorEmail: z.string().nullable(),
  entity: z.enum(LIBRARY_ENTITIES),
  entityId: z.string().nullable(),
  entityName: z.string(),
  action: z.string(),
  before: z.unknown().nullable(),
  after: z.unknown().nullable(),
});
export type RevisionDto = z.infer<typeof revisionSchema>;
export const revisionQuerySchema = z.object({
  entity: z.enum(LIBRARY_ENTITIES).optional(),
  entityId: z.string().uuid().optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
});

// ---- proposals
export const PROPOSAL_KINDS = ['new-package', 'alias', 'change'] as const;
export type ProposalKind = (typeof PROPOSAL_KINDS)[number];
export const PROPOSAL_STATUSES = ['open', 'approved', 'rejected'] as const;
const note = z.string().max(2000, 'At most 2000 characters');
export const proposalInputSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('new-package'), package: createPackageInputSchema, footprint: z.string().trim().max(200).nullable(), note }),
  z.object({ kind: z.literal('alias'), pattern: aliasPatternSchema, packageId: z.string().uuid('Choose a package'), footprint: z.string().trim().max(200).nullable(), note }),
  z.object({ kind: z.literal('change'), packageId: z.string().uuid(), package: packageInputSchema, note }),
]);
export type ProposalInput = z.infer<typeof proposalInputSchema>;
export const proposalSchema = z.object({
  id: z.string().uuid(),
  kind: z.enum(PROPOSAL_KINDS),
  status: z.enum(PROPOSAL_STATUSES),
  proposerEmail: z.string(),
  footprint: z.string().nullable(),
  packageId: z.string().nullable(),
  packageName: z.string().nullable(),
  /** the proposed package (new-package, change) or `{ pattern }` (alias) */
  payload: z.record(z.string(), z.unknown()),
  note: z.string(),
  decidedByEmail: z.string().nullable(),
  decidedAt: z.string().nullable(),
  decisionComment: z.string().nullable(),
  createdAt: z.string(),
  version: z.number().int(),
});
export type ProposalDto = z.infer<typeof proposalSchema>;
export const approveProposalInputSchema = z.object({
  /** The librarian's edited package (new-package, change); absent: as proposed. */
  package: createPackageInputSchema.optional(),
  /** The librarian's edited alias pattern (alias); absent: as proposed. */
  pattern: aliasPatternSchema.optional(),
  comment: z.string().max(2000).optional(),
});
export type ApproveProposalInput = z.infer<typeof approveProposalInputSchema>;
export const rejectProposalInputSchema = z.object({ comment: z.string().trim().min(1, 'Say why, so the proposer can put it right').max(2000) });

// ---- unmatched footprints
export const unmatchedSchema = z.object({
  id: z.string().uuid(),
  footprint: z.string(),
  count: z.number().int(),
  programs: z.array(z.object({ label: z.string(), count: z.number().int() })),
  firstSeen: z.string(),
  lastSeen: z.string(),
  status: z.enum(['open', 'resolved']),
  resolvedAt: z.string().nullable(),
  resolvedPackageName: z.string().nullable(),
  resolvedBy: z.string().nullable(),
});
export type UnmatchedDto = z.infer<typeof unmatchedSchema>;
export const addAliasFromUnmatchedInputSchema = z.object({ packageId: z.string().uuid('Choose a package'), pattern: aliasPatternSchema.optional() });

// ---- match, import, export, CSV
export const matchQuerySchema = z.object({ footprint: z.string().min(1, 'Give a footprint').max(200) });
export const matchResultSchema = z.object({
  footprint: z.string(),
  packageId: z.string().nullable(),
  packageName: z.string().nullable(),
  matchedBy: z.enum(['name', 'alias', 'pattern']).nullable(),
});
export type MatchResult = z.infer<typeof matchResultSchema>;
export const IMPORT_MODES = ['replace', 'merge'] as const;
export const importInputSchema = z.object({ mode: z.enum(IMPORT_MODES), file: z.unknown() });
export type ImportInput = z.infer<typeof importInputSchema>;
export const importResultSchema = z.object({
  mode: z.enum(IMPORT_MODES),
  packages: z.number().int(),
  aliases: z.number().int(),
  nozzles: z.number().int(),
  visionPresets: z.number().int(),
  machines: z.number().int(),
});
export type ImportResult = z.infer<typeof importResultSchema>;
export const csvInputSchema = z.object({ csv: z.string().min(1, 'The file is empty').max(900_000, 'At most about 900 kB of CSV at once') });
export const csvRowSchema = z.object({
  line: z.number().int(),
  name: z.string(),
  action: z.enum(['create', 'update']),
  errors: z.array(z.object({ path: z.string(), message: z.string() })),
  values: z.record(z.string(), z.unknown()).nullable(),
});
export type CsvRow = z.infer<typeof csvRowSchema>;
export const csvPreviewSchema = z.object({ columns: z.array(z.string()), rows: z.array(csvRowSchema), errorCount: z.number().int() });
export type CsvPreview = z.infer<typeof csvPreviewSchema>;
export const csvCommitResultSchema = z.object({ created: z.number().int(), updated: z.number().int() });
/** The CSV columns, in order (a header row names them; case and spaces are ignored). */
export const CSV_COLUMNS = ['name', 'family', 'length', 'width', 'height', 'offsetX', 'offsetY', 'courtyard', 'rotationOffset', 'polarised', 'overhang', 'nozzles', 'vision', 'tapeWidth', 'tapePitch', 'feeder', 'padLength', 'padWidth', 'padCount', 'aliases', 'notes'] as const;

/** Where a package is used: every program revision in work or released whose parts it places. */
export const packageUsageRevisionSchema = z.object({
  programId: z.string(),
  programName: z.string(),
  revisionId: z.string(),
  label: z.string(),
  state: z.enum(['draft', 'in-review', 'released']),
  /** references placed with this package (matched by footprint, or by an override) */
  parts: z.number().int().nonnegative(),
  /** of those, the ones that get it through an override */
  viaOverride: z.number().int().nonnegative(),
  /** the first references, in natural order */
  refs: z.array(z.string()),
  /** true for a revision in work: a change reaches it at its next check (and a revision in review
   * is checked again before release); released revisions keep the lists they were released with */
  affected: z.boolean(),
});
export const packageUsageSchema = z.object({
  packageId: z.string(),
  packageName: z.string(),
  revisions: z.array(packageUsageRevisionSchema),
  inWork: z.number().int().nonnegative(),
  released: z.number().int().nonnegative(),
});
export type PackageUsage = z.infer<typeof packageUsageSchema>;
