// The library file (the library's export format, shared/schemas/README.md), zod 4.
// Extra keys are allowed (passthrough) so that a library can carry notes and sources.
import { z } from 'zod';

const finite = z.number().finite();
const positive = z.number().finite().positive();

export const libraryBodySchema = z.looseObject({
  /** extent along X in the package's zero orientation, mm */
  length: positive,
  /** extent along Y in the package's zero orientation, mm */
  width: positive,
  height: positive,
  offsetX: finite.default(0),
  offsetY: finite.default(0),
});

export const libraryPackageSchema = z.looseObject({
  name: z.string().min(1),
  aliases: z.array(z.string().min(1)).default([]),
  body: libraryBodySchema,
  courtyard: z.number().finite().nonnegative().optional(),
  rotationOffset: finite.default(0),
  overhang: z.boolean().default(false),
  nozzles: z.array(z.string().min(1)).default([]),
  vision: z.string().min(1).optional(),
  tape: z.looseObject({ width: positive, pitch: positive }).optional(),
});

export const libraryNozzleSchema = z.looseObject({
  name: z.string().min(1),
  tipOuter: positive,
  tipInner: z.number().finite().nonnegative().optional(),
  holderRadius: positive,
});

export const libraryVisionPresetSchema = z.looseObject({
  name: z.string().min(1),
  method: z.string().min(1),
});

export const libraryFileSchema = z
  .looseObject({
    format: z.literal('placewright-library/1'),
    packages: z.array(libraryPackageSchema),
    nozzles: z.array(libraryNozzleSchema).default([]),
    visionPresets: z.array(libraryVisionPresetSchema).default([]),
  })
  .superRefine((lib, ctx) => {
    const seen = new Map<string, number>();
    lib.packages.forEach((p, i) => {
      const k = p.name.trim().toLowerCase();
      if (seen.has(k)) ctx.addIssue({ code: 'custom', message: `duplicate package name "${p.name}" (also packages.${seen.get(k)})`, path: ['packages', i, 'name'] });
      else seen.set(k, i);
    });
    // names compare without case and surrounding spaces (the engine's one name rule)
    const nz = new Set<string>();
    lib.nozzles.forEach((n, i) => {
      const k = n.name.trim().toLowerCase();
      if (nz.has(k)) ctx.addIssue({ code: 'custom', message: `duplicate nozzle "${n.name}"`, path: ['nozzles', i, 'name'] });
      nz.add(k);
    });
    const vp = new Set<string>();
    lib.visionPresets.forEach((v, i) => {
      const k = v.name.trim().toLowerCase();
      if (vp.has(k)) ctx.addIssue({ code: 'custom', message: `duplicate vision preset "${v.name}"`, path: ['visionPresets', i, 'name'] });
      vp.add(k);
    });
  });

export type LibraryFile = z.output<typeof libraryFileSchema>;
export type LibraryFileInput = z.input<typeof libraryFileSchema>;
export type LibraryPackage = z.output<typeof libraryPackageSchema>;
export type LibraryNozzle = z.output<typeof libraryNozzleSchema>;
export type LibraryVisionPreset = z.output<typeof libraryVisionPresetSchema>;
