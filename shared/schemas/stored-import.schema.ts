// A derived import as the server stores it (a jsonb column) and reads it back: the engine's
// ImportResult in its JSON form (records, no table) plus the engine version that made it. Reading
// it through this schema, not a cast, means a row written by older code is noticed and re-derived.
import { z } from 'zod';
import { FIELDS } from '../centroid';

const side = z.enum(['top', 'bottom']);

export const storedPlacementSchema = z.object({
  ref: z.string(),
  x: z.number(),
  y: z.number(),
  rotation: z.number(),
  side,
  footprint: z.string(),
  value: z.string(),
  partNumber: z.string(),
  dnp: z.boolean(),
  line: z.number().int(),
});

export const storedImportSchema = z.object({
  engineVersion: z.string().optional(),
  placements: z.array(storedPlacementSchema),
  columns: z.partialRecord(z.enum(FIELDS), z.string()),
  units: z.enum(['mm', 'mil', 'in']),
  dialect: z.object({
    delimiter: z.enum([',', ';', '\t']),
    decimalComma: z.boolean(),
    headerLine: z.number().int(),
    bom: z.boolean(),
    lineEnding: z.enum(['\n', '\r\n', '\r']),
    unitsSource: z.enum(['option', 'job', 'header', 'values']),
    dnpSense: z.enum(['dnp', 'fitted']).nullable(),
  }),
  headers: z.array(z.string()),
  warnings: z.array(z.object({ line: z.number().int().nullable(), message: z.string(), code: z.string().optional() })),
});
export type StoredImport = z.output<typeof storedImportSchema>;
