// `cli check JOB.json [--side top|bottom|both] [--out FILE]` (server/cli/README.md): run the job for the side(s)
// and print the findings as JSON. Exit 1 when an error-severity finding remains.
import type { Side } from '../../shared/core';
import { emit, EXIT_FINDINGS, EXIT_OK, loadJob, one, onePositional, parseArgs, runLoaded, warn, type Command } from './common';

const spec = { side: { values: ['top', 'bottom', 'both'] }, out: {} } as const;

/** The command line prints every finding up to this many (the summary counts all of them). */
export const CLI_FINDINGS_LIMIT = 200_000;

export const checkCommand: Command = {
  name: 'check',
  summary: 'verify the job (overlaps, board and panel outlines, fiducials, nozzle shadow, reach, packages)',
  help: `Usage: cli check JOB.json [--side top|bottom|both] [--out FILE]

Runs the job for the side(s) and checks every placed part (do-not-place parts are never checked):
  error    body-overlap, off-board, board-overlap, off-panel, fiducial-clearance,
           out-of-reach, no-package, no-nozzle
  warning  courtyard-overlap, nozzle-shadow, nozzle-size (the nozzle tip is wider than the
           body's smaller side), off-board of a package marked overhang
Prints { "findings": [ { key, kind, severity, side, board, boards, refs, message, geometry,
depth, distance } ], "summary": { errors, warnings, placements, seconds } }. refs are
"BOARD:REF", sorted by board number, then reference in natural order. Coordinates are in the
side's output frame (machine frame when fiducials were measured, else the panel frame).

Options:
  --side S      top, bottom or both (default both)
  --out FILE    write to FILE instead of stdout

Exit: 0 no error finding; 1 at least one error-severity finding; 2 bad input or options.`,
  async run(argv, io) {
    const t0 = performance.now();
    const args = parseArgs(argv, spec, 'check');
    if (args.help) {
      io.stdout(this.help + '\n');
      return EXIT_OK;
    }
    const jobPath = onePositional(args, 'check', 'job file');
    const choice = (one(args, 'side') ?? 'both') as Side | 'both';
    const sides: Side[] = choice === 'both' ? ['top', 'bottom'] : [choice];
    const loaded = await loadJob(jobPath);
    const run = runLoaded(loaded, sides, { limit: CLI_FINDINGS_LIMIT });
    const result = run.check!;
    // each distinct warning once (the sides share the import)
    warn(io, run.warnings, loaded.job.centroid);
    if (result.summary.truncated) {
      io.stderr(`warning: ${result.summary.errors + result.summary.warnings} findings; only the first ${result.findings.length} are listed\n`);
    }
    const { errors, warnings, placements } = result.summary;
    const out = {
      findings: result.findings,
      summary: { errors, warnings, placements, seconds: Math.round(performance.now() - t0) / 1000 },
    };
    await emit(JSON.stringify(out, null, 2), one(args, 'out'), io);
    return errors > 0 ? EXIT_FINDINGS : EXIT_OK;
  },
};
