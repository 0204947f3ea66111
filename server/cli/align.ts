import type { Side, TransformResult } from '../../shared/core';
import { emit, one, onePositional, parseArgs, runJobFile, warn, type Command } from './common';

const spec = { side: { values: ['top', 'bottom'] }, out: {} } as const;

function transformJson(t: TransformResult) {
  return {
    model: t.model,
    rotationDeg: t.rotationDeg,
    scale: t.scale,
    scalePpm: t.scalePpm,
    shearDeg: t.shearDeg,
    tx: t.tx,
    ty: t.ty,
    matrix: t.matrix,
    residuals: t.residuals,
    rmsResidual: t.rmsResidual,
    warnings: t.warnings.map((w) => ({ line: w.line, message: w.message })),
  };
}

export const alignCommand: Command = {
  name: 'align',
  summary: 'fit the fiducial transform (design panel frame → machine frame) and print it as JSON',
  help: `Usage: cli align JOB.json [--side top|bottom] [--out FILE]

Fits the transform from the panel fiducials' design positions to their measured positions
(model from the job's "transform": auto, translation, rigid, similarity or affine) and prints:
  { model, rotationDeg, scale, scalePpm, shearDeg, tx, ty, matrix: [[a, b, tx], [c, d, ty]],
    residuals: [ { name, dx, dy, distance } ], rmsResidual, warnings, boards: [ ... ] }
"boards" lists the boards with their own transform from measured local fiducials. With no
measured panel fiducial on the side, model is "none" (identity; the output frame is the panel).

Options:
  --side S      top (default) or bottom
  --out FILE    write to FILE instead of stdout

Exit: 0 done; 2 bad input (e.g. collinear fiducials under "affine").`,
  async run(argv, io) {
    const args = parseArgs(argv, spec, 'align');
    if (args.help) {
      io.stdout(this.help + '\n');
      return 0;
    }
    const jobPath = onePositional(args, 'align', 'job file');
    const side = (one(args, 'side') ?? 'top') as Side;
    const { result } = await runJobFile(jobPath, side);
    const boards = result.boardTransforms.map((b) => ({ board: b.board, ...transformJson(b.transform) }));
    const out = result.transform
      ? { ...transformJson(result.transform), boards }
      : {
          model: 'none',
          rotationDeg: 0,
          scale: 1,
          scalePpm: 0,
          shearDeg: 0,
          tx: 0,
          ty: 0,
          matrix: [[1, 0, 0], [0, 1, 0]],
          residuals: [],
          rmsResidual: 0,
          warnings: [{ line: null, message: `no panel fiducial is measured on the ${side} side; the output frame is the panel` }],
          boards,
        };
    warn(io, result.transform ? result.transform.warnings : [], undefined);
    await emit(JSON.stringify(out, null, 2), one(args, 'out'), io);
    return 0;
  },
};
