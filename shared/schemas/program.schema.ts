import { z } from 'zod';
import { findingKindSchema, findingSchema, findingsSummarySchema } from './finding.schema';
import { boardOutlineSchema, fiducialSchema, importOptionsSchema, limitsSchema, machineSchema, overrideSchema, panelSchema, type PartOverride } from './job.schema';

export const REVISION_STATES = ['draft', 'in-review', 'released', 'superseded', 'withdrawn'] as const;
export const revisionStateSchema = z.enum(REVISION_STATES);
export type RevisionStateName = z.infer<typeof revisionStateSchema>;

export const REVISION_STATE_LABELS: Record<RevisionStateName, string> = {
  draft: 'Draft',
  'in-review': 'In review',
  released: 'Released',
  superseded: 'Superseded',
  withdrawn: 'Withdrawn',
};

export const programNameSchema = z
  .string()
  .trim()
  .min(2, 'At least 2 characters')
  .max(80, 'At most 80 characters')
  .regex(/^[A-Za-z0-9][A-Za-z0-9._ -]*$/, 'Letters, digits, spaces, dot, dash and underscore; start with a letter or digit');

export const createProgramInputSchema = z.object({
  name: programNameSchema,
  product: z.string().trim().min(1, 'Name the product').max(120, 'At most 120 characters'),
  board: z.string().trim().min(1, 'Name the board and its design revision').max(120, 'At most 120 characters'),
});
export type CreateProgramInput = z.infer<typeof createProgramInputSchema>;

/**
 * A revision's job settings: the job file (shared/schemas/README.md) without the file names. Board and panel may
 * be missing while the engineer works through the stages; running needs both.
 */
export const revisionSettingsSchema = z.strictObject({
  import: importOptionsSchema.default({}),
  board: boardOutlineSchema.optional(),
  panel: panelSchema.optional(),
  fiducials: z.array(fiducialSchema).default([]),
  transform: z.enum(['auto', 'translation', 'rigid', 'similarity', 'affine']).default('auto'),
  limits: limitsSchema.default({ residual: 0.05, scalePpm: 1000, rotationDeg: 2 }),
  machine: machineSchema.optional(),
});
export type RevisionSettings = z.output<typeof revisionSettingsSchema>;

/** A job file (shared/schemas/README.md) as revision settings: the job without its file names and labels. */
export function settingsFromJob(job: Record<string, unknown>): RevisionSettings {
  const { centroid: _c, library: _l, program: _p, revision: _r, overrides: _o, ...settings } = job;
  return revisionSettingsSchema.parse(settings);
}
export type RevisionSettingsInput = z.input<typeof revisionSettingsSchema>;

export const updateSettingsInputSchema = z.object({
  settings: revisionSettingsSchema,
  version: z.number().int().min(1),
});

/** A part's override is the job file's (shared/schemas/job.schema.ts): one format, one reader. */
export { overrideSchema };
export type Override = PartOverride;

export const updateOverridesInputSchema = z.object({
  overrides: z.record(z.string().min(1).max(64), overrideSchema),
  version: z.number().int().min(1),
});

export const waiverScopeSchema = z.enum(['finding', 'every-board']);
export type WaiverScopeName = z.infer<typeof waiverScopeSchema>;

export const waiveInputSchema = z.object({
  key: z.string().min(1).max(500),
  reason: z.string().trim().min(5, 'Say why this finding is acceptable (at least 5 characters)').max(1000),
  /** 'every-board': one decision for this finding's kind and refs on every board of the panel */
  scope: waiverScopeSchema.default('finding'),
});

export const reviewDecisionInputSchema = z.object({
  comment: z.string().trim().max(4000).default(''),
});

export const rejectInputSchema = z.object({
  comment: z.string().trim().min(3, 'Tell the author what to change').max(4000),
});

export const commentInputSchema = z.object({
  side: z.enum(['top', 'bottom']),
  kind: z.enum(['comment', 'checked']).default('comment'),
  x: z.number().finite().nullable().default(null),
  y: z.number().finite().nullable().default(null),
  findingKey: z.string().max(500).nullable().default(null),
  text: z.string().trim().min(1, 'Write something').max(4000),
});

/** An image under the canvas: a photo or render of the board, aligned to the output frame. */
export const underlaySchema = z.object({
  dataUrl: z.string().regex(/^data:image\/(png|jpeg|webp);base64,/, 'A PNG, JPEG or WebP image').max(8_000_000, 'Images up to about 6 MB'),
  name: z.string().max(255),
  /** image size, px */
  width: z.number().int().positive(),
  height: z.number().int().positive(),
  /** image pixel (u right, v down) → output frame mm */
  transform: z.object({ a: z.number(), b: z.number(), c: z.number(), d: z.number(), tx: z.number(), ty: z.number() }),
  opacity: z.number().min(0).max(1),
});
export type Underlay = z.infer<typeof underlaySchema>;

export const underlayInputSchema = z.object({
  side: z.enum(['top', 'bottom']),
  underlay: underlaySchema.nullable(),
});

export const underlaysSchema = z.object({ top: underlaySchema.nullable().optional(), bottom: underlaySchema.nullable().optional() });
export type Underlays = z.infer<typeof underlaysSchema>;

export const problemReportInputSchema = z.object({
  text: z.string().trim().min(10, 'Describe the problem (at least 10 characters)').max(4000),
});

export const createTokenInputSchema = z.object({
  name: z.string().trim().min(2, 'Name the computer or script that will use it').max(80),
});

export const sideQuerySchema = z.object({ side: z.enum(['top', 'bottom']).default('top') });

// ---- responses -------------------------------------------------------------------------------

export const userRefSchema = z.object({ id: z.string(), name: z.string(), email: z.string() }).nullable();

export const revisionSummarySchema = z.object({
  id: z.string(),
  programId: z.string(),
  label: z.string(),
  state: revisionStateSchema,
  author: userRefSchema,
  reviewer: userRefSchema,
  centroidName: z.string().nullable(),
  placements: z.number().int(),
  checkedAt: z.string().nullable(),
  errors: z.number().int().nullable(),
  warnings: z.number().int().nullable(),
  /** error findings neither fixed nor waived (null when not checked) */
  openErrors: z.number().int().nullable(),
  submittedAt: z.string().nullable(),
  releasedAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  version: z.number().int(),
});
export type RevisionSummary = z.infer<typeof revisionSummarySchema>;

export const programSchema = z.object({
  id: z.string(),
  name: z.string(),
  product: z.string(),
  board: z.string(),
  owner: userRefSchema,
  createdAt: z.string(),
  updatedAt: z.string(),
  revisions: z.array(revisionSummarySchema),
});
export type ProgramDto = z.infer<typeof programSchema>;

export const waiverSchema = z.object({
  id: z.string(),
  /** a finding's key; for scope 'every-board', the kind and refs with `*` for the board */
  findingKey: z.string(),
  scope: waiverScopeSchema.default('finding'),
  kind: z.string(),
  reason: z.string(),
  userEmail: z.string(),
  at: z.string(),
  /** findings of the last check this waiver covers (one for a finding waiver that still applies) */
  covers: z.number().int().nonnegative().default(0),
});
export type WaiverDto = z.infer<typeof waiverSchema>;

export const commentSchema = z.object({
  id: z.string(),
  side: z.enum(['top', 'bottom']),
  kind: z.enum(['comment', 'checked']),
  x: z.number().nullable(),
  y: z.number().nullable(),
  findingKey: z.string().nullable(),
  text: z.string(),
  userEmail: z.string(),
  at: z.string(),
});
export type CommentDto = z.infer<typeof commentSchema>;

export const releaseFileSchema = z.object({
  side: z.enum(['top', 'bottom']),
  format: z.enum(['csv', 'json']),
  sha256: z.string(),
  placements: z.number().int(),
  bytes: z.number().int(),
  url: z.string(),
});
export type ReleaseFileDto = z.infer<typeof releaseFileSchema>;

export const revisionDetailSchema = revisionSummarySchema.extend({
  program: z.object({ id: z.string(), name: z.string(), product: z.string(), board: z.string() }),
  settings: revisionSettingsSchema,
  centroidSha256: z.string().nullable(),
  imported: z
    .object({
      rows: z.number().int(),
      dnp: z.number().int(),
      top: z.number().int(),
      bottom: z.number().int(),
      units: z.string(),
      columns: z.record(z.string(), z.string()),
      headers: z.array(z.string()),
      dialect: z.record(z.string(), z.unknown()),
      warnings: z.array(z.object({ line: z.number().nullable(), message: z.string() })),
      /** the placed parts' centres in the file's design coordinates (mm), null with none placed */
      extent: z.object({ minX: z.number(), minY: z.number(), maxX: z.number(), maxY: z.number() }).nullable().optional(),
    })
    .nullable(),
  overrides: z.record(z.string(), overrideSchema),
  findings: z.array(findingSchema).nullable(),
  findingsSummary: findingsSummarySchema.nullable(),
  waivers: z.array(waiverSchema),
  comments: z.array(commentSchema),
  releaseFiles: z.array(releaseFileSchema),
  reviewComment: z.string().nullable(),
  reviewedAt: z.string().nullable(),
  hasUnderlay: z.boolean(),
  /** everyone who changed the revision and what they did: none of them may approve it (four-eyes) */
  contributors: z.array(z.object({ name: z.string(), email: z.string(), actions: z.array(z.string()) })).default([]),
  /** what the signed-in user may do now */
  can: z.object({ edit: z.boolean(), submit: z.boolean(), review: z.boolean(), withdraw: z.boolean(), newRevision: z.boolean() }),
});
export type RevisionDetail = z.infer<typeof revisionDetailSchema>;

export const runFileSchema = z.object({
  revisionId: z.string(),
  programId: z.string(),
  programName: z.string(),
  product: z.string(),
  board: z.string(),
  label: z.string(),
  state: z.enum(['released', 'superseded']),
  releasedAt: z.string().nullable(),
  author: userRefSchema,
  reviewer: userRefSchema,
  files: z.array(releaseFileSchema),
});
export type RunFileDto = z.infer<typeof runFileSchema>;

export const apiTokenSchema = z.object({
  id: z.string(),
  name: z.string(),
  prefix: z.string(),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});
export type ApiTokenDto = z.infer<typeof apiTokenSchema>;

/** One waiver as the reviewer reads it: whose decision, why, when, and how many findings it covers. */
export const reviewWaiverSchema = z.object({
  id: z.string(),
  scope: waiverScopeSchema,
  kind: findingKindSchema,
  findingKey: z.string(),
  /** "BOARD:REF" for a finding waiver; bare references for an every-board waiver */
  refs: z.array(z.string()),
  reason: z.string(),
  userEmail: z.string(),
  userName: z.string().nullable(),
  at: z.string(),
  covers: z.number().int().nonnegative(),
});
export type ReviewWaiver = z.infer<typeof reviewWaiverSchema>;

/** Differences in the imported parts against the last released revision (by reference). */
export const revisionChangesSchema = z.object({
  /** the revision compared with; null when none of the program was released before */
  since: z.object({ revisionId: z.string(), label: z.string(), releasedAt: z.string().nullable() }).nullable(),
  added: z.array(z.string()),
  removed: z.array(z.string()),
  /** position, rotation or side changed */
  moved: z.array(z.string()),
  /** footprint or value changed */
  changed: z.array(z.string()),
  /** settings sections that differ: board, panel, fiducials, transform, limits, machine, import */
  settings: z.array(z.string()),
  /** references whose override was added, removed or changed */
  overrides: z.array(z.string()),
});
export type RevisionChanges = z.infer<typeof revisionChangesSchema>;

/** What a reviewer approves: findings by kind with their waivers, the overrides, the changes. */
export const reviewSummarySchema = z.object({
  revisionId: z.string(),
  programId: z.string(),
  programName: z.string(),
  label: z.string(),
  state: revisionStateSchema,
  checkedAt: z.string().nullable(),
  placements: z.number().int().nonnegative(),
  /** null while the revision is not checked since its last change */
  findings: z
    .object({
      total: z.number().int().nonnegative(),
      errors: z.number().int().nonnegative(),
      warnings: z.number().int().nonnegative(),
      /** findings a waiver covers */
      waived: z.number().int().nonnegative(),
      /** error findings no waiver covers: release needs none */
      openErrors: z.number().int().nonnegative(),
    })
    .nullable(),
  byKind: z.array(
    z.object({
      kind: findingKindSchema,
      severity: z.enum(['error', 'warning']),
      count: z.number().int().nonnegative(),
      waived: z.number().int().nonnegative(),
      waivers: z.array(reviewWaiverSchema),
    }),
  ),
  /** waivers whose findings are gone on the last check (kept: a later check may bring them back) */
  unusedWaivers: z.array(reviewWaiverSchema),
  overrides: z.array(
    z.object({
      ref: z.string(),
      package: z.string().nullable(),
      nozzle: z.string().nullable(),
      vision: z.string().nullable(),
      reason: z.string(),
      /** the part's footprint; null when no placed part has this reference */
      footprint: z.string().nullable(),
      /** what today's library gives the part without the override */
      instead: z.object({ package: z.string().nullable(), nozzle: z.string().nullable(), vision: z.string().nullable() }),
    }),
  ),
  changes: revisionChangesSchema,
});
export type ReviewSummaryDto = z.infer<typeof reviewSummarySchema>;

export { findingSchema, findingsSummarySchema };
