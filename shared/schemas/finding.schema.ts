import { z } from 'zod';

/** The kinds of finding of the `check` step (shared/README.md, "Findings"), in report order. */
export const FINDING_KINDS = [
  'body-overlap',
  'courtyard-overlap',
  'off-board',
  'board-overlap',
  'off-panel',
  'fiducial-clearance',
  'nozzle-shadow',
  'out-of-reach',
  'no-package',
  'no-nozzle',
  'nozzle-size',
] as const;

export const findingKindSchema = z.enum(FINDING_KINDS);
export type FindingKind = z.infer<typeof findingKindSchema>;

export const findingSeveritySchema = z.enum(['error', 'warning']);
export type FindingSeverity = z.infer<typeof findingSeveritySchema>;

const pairSchema = z.tuple([z.number(), z.number()]);

/** What to draw for a finding, in the output frame of its side (mm). */
export const findingGeometrySchema = z.discriminatedUnion('type', [
  /** an area: the common part of two overlapping bodies / courtyards / boards, or the outline of a
   * body or board that leaves its board or panel, or the panel outline */
  z.object({ type: z.literal('polygon'), points: z.array(pairSchema).min(3) }),
  /** a place: a body centre (out of reach, no package, no nozzle, nozzle size) */
  z.object({ type: z.literal('point'), x: z.number(), y: z.number() }),
  /** a gap: from a fiducial centre or a part centre to the nearest point of a body */
  z.object({ type: z.literal('segment'), from: pairSchema, to: pairSchema }),
]);
export type FindingGeometry = z.infer<typeof findingGeometrySchema>;

export const findingSchema = z.object({
  /** stable across re-runs: kind plus the sorted refs (or boards); waivers are keyed by it */
  key: z.string().min(1),
  kind: findingKindSchema,
  severity: findingSeveritySchema,
  /** side whose output frame the geometry is in */
  side: z.enum(['top', 'bottom']),
  /** board of the first ref (or the first board); null for a panel-wide finding */
  board: z.number().int().positive().nullable(),
  /** every board involved, ascending */
  boards: z.array(z.number().int().positive()),
  /** "BOARD:REF", sorted by board number then reference in natural order (R2 before R10) */
  refs: z.array(z.string()),
  message: z.string().min(1),
  geometry: findingGeometrySchema,
  /** how far into the forbidden area, mm: overlap depth, distance outside the board / panel /
   * reach, shortfall of a clearance, how much wider the nozzle tip is than the body's smaller
   * side; null where it does not apply (no package, no nozzle) */
  depth: z.number().nonnegative().nullable(),
  /** an actual distance, mm: bodies' gap (courtyard), body to fiducial centre, part centre to
   * the taller neighbour; null where it does not apply */
  distance: z.number().nonnegative().nullable(),
  /** fiducial-clearance: the fiducial whose clear circle is entered (the deepest one) */
  fiducial: z.string().optional(),
});
export type Finding = z.infer<typeof findingSchema>;

export const findingsSummarySchema = z.object({
  errors: z.number().int().nonnegative(),
  warnings: z.number().int().nonnegative(),
  placements: z.number().int().nonnegative(),
  seconds: z.number().nonnegative(),
  byKind: z.record(findingKindSchema, z.number().int().nonnegative()).optional(),
  truncated: z.boolean().optional(),
});
export type FindingsSummary = z.infer<typeof findingsSummarySchema>;

/** The `check` result (CLI output and API body). */
export const checkResultSchema = z.object({
  findings: z.array(findingSchema),
  summary: findingsSummarySchema,
});
export type CheckResult = z.infer<typeof checkResultSchema>;
