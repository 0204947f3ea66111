import { z } from 'zod';
import { machineSchema } from './job.schema';

/**
 * The answer of GET /api/run-files/:id/setup-sheet: the released JSON lists of each side (format 1
 * of shared/placement-list/README.md, read loosely: unknown keys are dropped), the machine and the program.
 */
const num = z.number();

export const setupSheetPlacementSchema = z.object({
  seq: z.number().int(),
  board: z.number().int(),
  ref: z.string(),
  x: num,
  y: num,
  rotation: num,
  package: z.string().nullable(),
  nozzle: z.string().nullable(),
  vision: z.string().nullable(),
  height: num.nullable(),
  partNumber: z.string(),
  value: z.string(),
});
export type SetupSheetPlacement = z.infer<typeof setupSheetPlacementSchema>;

export const setupSheetListSchema = z.object({
  format: z.string(),
  meta: z.object({
    program: z.string(),
    revision: z.string(),
    side: z.enum(['top', 'bottom']),
    units: z.string(),
    frame: z.enum(['machine', 'panel']),
    boards: z.number().int(),
    placements: z.number().int(),
    generated: z.string(),
  }),
  fiducials: z.array(z.object({ name: z.string(), x: num, y: num })),
  placements: z.array(setupSheetPlacementSchema),
});
export type SetupSheetList = z.infer<typeof setupSheetListSchema>;

export const setupSheetSchema = z.object({
  program: z.object({ id: z.string(), name: z.string(), product: z.string(), board: z.string() }),
  revision: z.object({ id: z.string(), label: z.string(), state: z.string(), releasedAt: z.string().nullable() }),
  machine: machineSchema.nullable(),
  sides: z.array(z.object({ side: z.enum(['top', 'bottom']), sha256: z.string(), list: setupSheetListSchema })),
});
export type SetupSheetDto = z.infer<typeof setupSheetSchema>;
