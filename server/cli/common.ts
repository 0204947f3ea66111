// Shared plumbing of the command line: options, file I/O, job loading, output, exit codes.
import { readFile, writeFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { EngineInputError } from '../../shared/core';
import { parseWith } from '../../shared/core';
import { jobSchema, type Job } from '../../shared/schemas/job.schema';
import { libraryFileSchema, type LibraryFile } from '../../shared/schemas/library-file.schema';
import { runRevision, type RevisionRun } from '../../shared/engine';
import type { RunResult, Side } from '../../shared/core';

export const EXIT_OK = 0;
export const EXIT_FINDINGS = 1;
export const EXIT_BAD_INPUT = 2;

/** Bad command-line use: unknown option, missing argument, bad value (exit 2). */
export class CliUsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CliUsageError';
  }
}

export interface CliIo {
  stdout: (s: string) => void;
  stderr: (s: string) => void;
}

export interface Command {
  name: string;
  /** one line for the command list */
  summary: string;
  /** full --help text */
  help: string;
  run(argv: string[], io: CliIo): Promise<number>;
}

export interface OptionSpec {
  /** allowed values; omit for free text */
  values?: readonly string[];
  /** may be given more than once */
  repeat?: boolean;
  /** takes no value */
  flag?: boolean;
}

export interface ParsedArgs {
  positionals: string[];
  options: Map<string, string[]>;
  help: boolean;
}

export function parseArgs(argv: string[], spec: Record<string, OptionSpec>, command: string): ParsedArgs {
  const positionals: string[] = [];
  const options = new Map<string, string[]>();
  let help = false;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--help' || a === '-h') {
      help = true;
      continue;
    }
    if (a === '--') {
      positionals.push(...argv.slice(i + 1));
      break;
    }
    if (!a.startsWith('--')) {
      positionals.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
    const s = spec[name];
    if (!s) {
      throw new CliUsageError(`${command}: unknown option --${name} (expected ${Object.keys(spec).map((k) => '--' + k).join(', ')}, --help)`);
    }
    let value: string;
    if (s.flag) value = 'true';
    else if (eq > 0) value = a.slice(eq + 1);
    else {
      if (i + 1 >= argv.length || argv[i + 1].startsWith('--')) throw new CliUsageError(`${command}: --${name} needs a value`);
      value = argv[++i];
    }
    if (s.values && !s.values.includes(value)) {
      throw new CliUsageError(`${command}: --${name} ${value}: expected ${s.values.join('|')}`);
    }
    const prev = options.get(name);
    if (prev && !s.repeat) throw new CliUsageError(`${command}: --${name} given twice`);
    options.set(name, [...(prev ?? []), value]);
  }
  return { positionals, options, help };
}

export function one(args: ParsedArgs, name: string): string | undefined {
  return args.options.get(name)?.[0];
}

export function onePositional(args: ParsedArgs, command: string, what: string): string {
  if (args.positionals.length !== 1) {
    throw new CliUsageError(
      `${command}: expected one ${what}, got ${args.positionals.length === 0 ? 'none' : args.positionals.map((p) => `"${p}"`).join(' ')} (see --help)`,
    );
  }
  return args.positionals[0];
}

export async function readText(path: string, shown = path): Promise<string> {
  try {
    return await readFile(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, expected a file' : (e as Error).message;
    throw new EngineInputError(`cannot read: ${why}`, { file: shown, code: 'unreadable' });
  }
}

/** JSON.parse with the line and column of a syntax error. */
export function parseJsonText(text: string, file: string): unknown {
  try {
    return JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    const msg = (e as Error).message;
    const m = /position (\d+)/.exec(msg);
    let line: number | undefined;
    let column: string | undefined;
    if (m) {
      const before = text.slice(0, Number(m[1]));
      line = before.split('\n').length;
      column = String(Number(m[1]) - before.lastIndexOf('\n'));
    }
    throw new EngineInputError(`not valid JSON: ${msg.replace(/ in JSON at position \d+.*$/, '')}`, { file, line, column, code: 'bad-json' });
  }
}

export interface LoadedJob {
  job: Job;
  jobPath: string;
  centroidPath: string;
  centroidText: string;
  library: LibraryFile | null;
  libraryPath: string | null;
}

/** Read and validate the job file, its centroid file and its library file. */
export async function loadJob(jobPath: string): Promise<LoadedJob> {
  const job = parseWith(jobSchema, parseJsonText(await readText(jobPath), jobPath), jobPath);
  const dir = dirname(resolve(jobPath));
  const centroidPath = resolve(dir, job.centroid);
  const centroidText = await readText(centroidPath, job.centroid);
  let library: LibraryFile | null = null;
  let libraryPath: string | null = null;
  if (job.library) {
    libraryPath = resolve(dir, job.library);
    library = parseWith(libraryFileSchema, parseJsonText(await readText(libraryPath, job.library), job.library), job.library);
  }
  return { job, jobPath, centroidPath, centroidText, library, libraryPath };
}

/** Run a loaded job through the engine's one entry (runRevision), for the sides asked. */
export function runLoaded(loaded: LoadedJob, sides: Side[], check: boolean | { limit?: number }): RevisionRun {
  return runRevision({
    job: loaded.job,
    centroidText: loaded.centroidText,
    library: loaded.library,
    sides,
    check,
    jobFile: loaded.jobPath,
    centroidFile: loaded.job.centroid,
  });
}

/** Load a job and run the engine for one side (no checks). */
export async function runJobFile(jobPath: string, side: Side): Promise<{ loaded: LoadedJob; result: RunResult }> {
  const loaded = await loadJob(jobPath);
  return { loaded, result: runLoaded(loaded, [side], false).runs[0] };
}

/** Write to --out FILE, else stdout. */
export async function emit(text: string, out: string | undefined, io: CliIo): Promise<void> {
  if (out) {
    try {
      await writeFile(out, text, 'utf8');
    } catch (e) {
      throw new EngineInputError(`cannot write: ${(e as Error).message}`, { file: out, field: '--out', code: 'unwritable' });
    }
  } else io.stdout(text.endsWith('\n') ? text : text + '\n');
}

export function warn(io: CliIo, warnings: { line: number | null; message: string }[], file?: string): void {
  for (const w of warnings) io.stderr(`warning: ${file && w.line !== null ? `${file}:${w.line}: ` : w.line !== null ? `line ${w.line}: ` : ''}${w.message}\n`);
}
