// What the Import page says when a file cannot be read. The engine's messages are written for the
// command line too (they name flags such as --units); on the web the same problem points at the
// page's own controls instead.
import { ApiError } from '../../../../lib/api-client';

export interface ImportProblem {
  title: string;
  message: string;
  /** located details (line, column) worth listing; empty when the message says it all */
  details: { path: string; message: string }[];
  /** the file's units cannot be told: the Units control is the answer */
  needsUnits: boolean;
}

const UNITS_UNKNOWN = /units cannot be told|no unit in the header/i;
const UNITS_MIXED = /without a unit while other values carry one/i;
const EMPTY = /\bis empty\b|file is empty|^Empty file$/i;
const NOT_TEXT = /not a text file/i;

/** Drops the command-line flags from an engine message ("; give --units mm|mil|in", "(map one with --map …)"). */
export function withoutFlags(message: string): string {
  return message
    .replace(/;?\s*give --units [a-z|]+/gi, '')
    .replace(/\s*\((?:map one with )?--map [^)]*\)/gi, '')
    .replace(/^--map (\w+)=/i, 'column mapping $1 = ')
    .trim();
}

/** Is this message (an engine or server text) the "units unknown" one? */
export function isUnitsMessage(message: string): boolean {
  return UNITS_UNKNOWN.test(message) || UNITS_MIXED.test(message);
}

export const UNITS_HELP = 'The file does not say whether its coordinates are in millimetres, mils or inches: there is no unit in the header (such as “X(mm)”) and none on the values. Choose the units in Units, on the left; the preview runs again at once.';
export const MIXED_UNITS_HELP = 'Some coordinates carry a unit and others are bare numbers. Choose the units of the bare numbers in Units, on the left; the preview runs again at once.';

export function describeImportProblem(error: unknown, fileName?: string | null): ImportProblem {
  const p = error instanceof ApiError ? error.problem : null;
  const raw = error instanceof Error ? error.message : String(error);
  const texts = [raw, ...(p?.errors.map((e) => e.message) ?? [])];
  if (texts.some((t) => UNITS_MIXED.test(t))) {
    const at = p?.errors.find((e) => /line \d+/.test(e.path))?.path;
    return { title: 'Choose the units', message: MIXED_UNITS_HELP, details: at ? [{ path: at, message: 'the first bare number' }] : [], needsUnits: true };
  }
  if (texts.some((t) => UNITS_UNKNOWN.test(t))) return { title: 'Choose the units', message: UNITS_HELP, details: [], needsUnits: true };
  if (texts.some((t) => EMPTY.test(t))) {
    return { title: 'The file is empty', message: `${fileName ? `${fileName} holds` : 'The file holds'} no header and no rows. Export the centroid file again and choose it.`, details: [], needsUnits: false };
  }
  if (texts.some((t) => NOT_TEXT.test(t))) return { title: 'Not a text file', message: withoutFlags(raw), details: [], needsUnits: false };
  const generic = !p || p.title === 'Bad request' || p.title === 'Invalid input';
  return {
    title: generic ? (p && p.status >= 500 ? 'The server could not read the file' : 'The file cannot be imported') : p.title,
    message: withoutFlags(raw),
    details: (p?.errors ?? []).filter((e) => e.path !== '(input)' && e.message.trim() !== '' && !(raw.includes(e.path) && raw.includes(e.message))).map((e) => ({ path: e.path, message: withoutFlags(e.message) })),
    needsUnits: false,
  };
}
