// The job file (shared/schemas/README.md, "Job file"), zod 4. Strict objects: a misspelt key is an error, not ignored.
import { z } from 'zod';
import { FIELDS } from '../centroid';

const finite = z.number().finite();
const positive = z.number().finite().positive();
const xy = z.strictObject({ x: finite, y: finite });

export const importOptionsSchema = z.strictObject({
  units: z.enum(['mm', 'mil', 'in']).optional(),
  bottomRotation: z.enum(['bottom-view', 'negate', 'mirror-180']).optional(),
  map: z.partialRecord(z.enum(FIELDS), z.string().min(1)).optional(),
});

export const boardOutlineSchema = z.strictObject({
  originX: finite.default(0),
  originY: finite.default(0),
  width: positive,
  height: positive,
});

const cell = z.strictObject({ row: z.number().int().nonnegative(), col: z.number().int().nonnegative() });

export const gridSchema = z.strictObject({
  rows: z.number().int().positive(),
  cols: z.number().int().positive(),
  pitchX: finite,
  pitchY: finite,
  offsetX: finite.default(0),
  offsetY: finite.default(0),
  rotation: finite.default(0),
  cellRotations: z.array(cell.extend({ rotation: finite })).default([]),
  skip: z.array(cell).default([]),
});

export const instanceSchema = z.strictObject({
  x: finite,
  y: finite,
  rotation: finite.default(0),
  /** a skipped instance keeps its number and places nothing */
  skip: z.boolean().default(false),
});

export const panelSchema = z
  .strictObject({
    width: positive,
    height: positive,
    flipAxis: z.enum(['vertical', 'horizontal']).default('vertical'),
    grid: gridSchema.optional(),
    instances: z.array(instanceSchema).min(1).optional(),
  })
  .superRefine((p, ctx) => {
    if (p.grid && p.instances) ctx.addIssue({ code: 'custom', message: 'give grid or instances, not both', path: ['instances'] });
    if (!p.grid && !p.instances) ctx.addIssue({ code: 'custom', message: 'give grid or instances', path: ['grid'] });
  });

const fiducialBase = {
  name: z.string().min(1),
  side: z.enum(['top', 'bottom']).default('top'),
  x: finite,
  y: finite,
  clearRadius: positive.default(1.0),
};

export const fiducialSchema = z.discriminatedUnion('frame', [
  z.strictObject({ ...fiducialBase, frame: z.literal('panel'), measured: xy.optional() }),
  z.strictObject({
    ...fiducialBase,
    frame: z.literal('board'),
    /** keyed by board number */
    measured: z.record(z.string().regex(/^[1-9]\d*$/, 'a board number'), xy).optional(),
  }),
]);

export const machineSchema = z.strictObject({
  name: z.string().optional(),
  reachX: positive,
  reachY: positive,
  nozzles: z.array(z.string().min(1)).default([]),
});

/** alignment warning limits (shared/README.md, "Fiducial transform" defaults) */
export const limitsSchema = z.strictObject({
  residual: positive.default(0.05),
  scalePpm: positive.default(1000),
  rotationDeg: positive.default(2),
});

/**
 * One part's override, keyed by its reference in `overrides`: a package, nozzle or vision preset
 * named as in the library (case and surrounding spaces ignored), and the reason, which a reviewer
 * reads. Applied by the engine before the placements are built (shared/library).
 */
export const overrideSchema = z
  .strictObject({
    package: z.string().trim().min(1).max(120).optional(),
    nozzle: z.string().trim().min(1).max(60).optional(),
    vision: z.string().trim().min(1).max(60).optional(),
    reason: z.string().trim().min(3, 'Say why (at least 3 characters)').max(500),
  })
  .refine((o) => o.package !== undefined || o.nozzle !== undefined || o.vision !== undefined, { message: 'override at least one of package, nozzle or vision' });

/** Overrides keyed by part reference (as in the centroid file, case-sensitive like the file). */
export const overridesSchema = z.record(z.string().min(1).max(64), overrideSchema);

export const jobSchema = z.strictObject({
  centroid: z.string().min(1),
  import: importOptionsSchema.default({}),
  board: boardOutlineSchema,
  panel: panelSchema,
  fiducials: z.array(fiducialSchema).default([]),
  transform: z.enum(['auto', 'translation', 'rigid', 'similarity', 'affine']).default('auto'),
  limits: limitsSchema.default({ residual: 0.05, scalePpm: 1000, rotationDeg: 2 }),
  library: z.string().min(1).optional(),
  machine: machineSchema.optional(),
  program: z.string().optional(),
  revision: z.string().optional(),
  overrides: overridesSchema.default({}),
});

export type JobInput = z.input<typeof jobSchema>;
export type Job = z.output<typeof jobSchema>;
export type JobPanel = Job['panel'];
export type JobGrid = z.output<typeof gridSchema>;
export type JobFiducial = z.output<typeof fiducialSchema>;
export type JobMachine = z.output<typeof machineSchema>;
export type AlignLimits = z.output<typeof limitsSchema>;
export type PartOverride = z.output<typeof overrideSchema>;
