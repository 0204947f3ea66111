import { importCentroid } from '../../shared/centroid';
import { FIELDS, isField, type Field } from '../../shared/centroid';
import type { BottomRotation, Units } from '../../shared/core';
import { CliUsageError, emit, one, onePositional, parseArgs, readText, type Command } from './common';

const spec = {
  units: { values: ['mm', 'mil', 'in'] },
  'bottom-rotation': { values: ['bottom-view', 'negate', 'mirror-180'] },
  map: { repeat: true },
  out: {},
} as const;

export const importCommand: Command = {
  name: 'import',
  summary: 'read a centroid file and print its placements as JSON (mm, design frame)',
  help: `Usage: cli import FILE.csv [--units mm|mil|in] [--bottom-rotation bottom-view|negate|mirror-180]
                  [--map FIELD=HEADER ...] [--out FILE]

Reads a centroid CSV (comma, semicolon or tab; decimal point or comma; preamble lines allowed),
recognises its columns and prints JSON:
  { "placements": [ { ref, x, y, rotation, side, footprint, value, partNumber, dnp } ],
    "columns": { FIELD: HEADER }, "units", "warnings": [ { line, message } ], "dialect" }
Coordinates in mm in the design frame; rotation in [0, 360); bottom rotations as seen from the
bottom (converted as --bottom-rotation says; default bottom-view).

Options:
  --units U             units of plain numbers; without it they come from the header
                        ("X(mil)") or the values ("12.5mm"), else the file is refused
  --bottom-rotation R   how the file reports bottom rotations
  --map FIELD=HEADER    use column HEADER for FIELD (${FIELDS.join(' ')}); repeatable
  --out FILE            write to FILE instead of stdout

Exit: 0 done; 2 bad input (one line on stderr naming the file, line and column).`,
  async run(argv, io) {
    const args = parseArgs(argv, spec, 'import');
    if (args.help) {
      io.stdout(this.help + '\n');
      return 0;
    }
    const file = onePositional(args, 'import', 'centroid file');
    const map: Partial<Record<Field, string>> = {};
    for (const m of args.options.get('map') ?? []) {
      const eq = m.indexOf('=');
      const f = eq > 0 ? m.slice(0, eq).trim() : '';
      if (eq <= 0 || !isField(f) || m.slice(eq + 1).trim() === '') {
        throw new CliUsageError(`import: --map ${m}: expected FIELD=HEADER with FIELD one of ${FIELDS.join(', ')}`);
      }
      map[f] = m.slice(eq + 1);
    }
    const r = importCentroid(await readText(file), {
      file,
      units: one(args, 'units') as Units | undefined,
      bottomRotation: one(args, 'bottom-rotation') as BottomRotation | undefined,
      map,
    });
    const out = {
      placements: r.placements.map((p) => ({
        ref: p.ref,
        x: p.x,
        y: p.y,
        rotation: p.rotation,
        side: p.side,
        footprint: p.footprint,
        value: p.value,
        partNumber: p.partNumber,
        dnp: p.dnp,
      })),
      columns: r.columns,
      units: r.units,
      warnings: r.warnings.map((w) => ({ line: w.line, message: w.message })),
      dialect: r.dialect,
    };
    await emit(JSON.stringify(out, null, 2), one(args, 'out'), io);
    return 0;
  },
};
