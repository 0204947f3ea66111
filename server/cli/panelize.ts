import { writePlacementListCsv, writePlacementListJson } from '../../shared/placement-list';
import type { Side } from '../../shared/core';
import { CliUsageError, emit, one, onePositional, parseArgs, runJobFile, warn, type Command } from './common';

const spec = {
  side: { values: ['top', 'bottom'] },
  format: { values: ['csv', 'json'] },
  out: {},
  generated: {},
} as const;

export const panelizeCommand: Command = {
  name: 'panelize',
  summary: 'step the board out over the panel and print the neutral placement list',
  help: `Usage: cli panelize JOB.json [--side top|bottom] [--format csv|json] [--out FILE]

Imports the job's centroid file, steps the board out over the panel, applies the fiducial
transform (when fiducials are measured on that side), assigns library packages and prints the
neutral placement list (shared/placement-list/README.md) for one side.

Options:
  --side S        top (default) or bottom
  --format F      csv (default) or json
  --out FILE      write to FILE instead of stdout
  --generated T   the "generated" time stamp (ISO 8601), for reproducible output; default now

Warnings (units inferred, fiducial residuals, ...) go to stderr.
Exit: 0 done; 2 bad input (one line on stderr naming the file and the line or field).`,
  async run(argv, io) {
    const args = parseArgs(argv, spec, 'panelize');
    if (args.help) {
      io.stdout(this.help + '\n');
      return 0;
    }
    const jobPath = onePositional(args, 'panelize', 'job file');
    const side = (one(args, 'side') ?? 'top') as Side;
    const { loaded, result } = await runJobFile(jobPath, side);
    const generated = one(args, 'generated');
    const opts = { generated: generated ?? new Date() };
    if (generated !== undefined && Number.isNaN(new Date(generated).getTime())) {
      throw new CliUsageError(`panelize: --generated ${generated}: expected an ISO 8601 time`);
    }
    const { text } = one(args, 'format') === 'json' ? await writePlacementListJson(result, opts) : await writePlacementListCsv(result, opts);
    warn(io, result.warnings, loaded.job.centroid);
    await emit(text, one(args, 'out'), io);
    return 0;
  },
};
