/** Bad input to the engine: a centroid file, a job file, a library file, an option. The CLI prints
 * `toLine()` on stderr and exits 2; the server turns the fields into a 400 problem body. */
export interface EngineInputErrorFields {
  file?: string;
  /** 1-based physical line */
  line?: number;
  /** the column as written in the header (or the 1-based column number when there is no header) */
  column?: string;
  /** a field path in a JSON input (e.g. `panel.grid.rows`) or an option name (`--units`) */
  field?: string;
  /** short machine-readable tag, e.g. 'duplicate-ref', 'bad-number', 'no-units' */
  code?: string;
}

export class EngineInputError extends Error {
  readonly file?: string;
  readonly line?: number;
  readonly column?: string;
  readonly field?: string;
  readonly code?: string;
  /** the message without location prefix */
  readonly detail: string;

  constructor(detail: string, fields: EngineInputErrorFields = {}) {
    super(formatLocation(fields) + detail);
    this.name = 'EngineInputError';
    this.detail = detail;
    this.file = fields.file;
    this.line = fields.line;
    this.column = fields.column;
    this.field = fields.field;
    this.code = fields.code;
  }

  /** the same error with a file name filled in (when it had none) */
  withFile(file: string): EngineInputError {
    if (this.file) return this;
    return new EngineInputError(this.detail, { ...this.fields(), file });
  }

  fields(): EngineInputErrorFields & { message: string } {
    return {
      file: this.file,
      line: this.line,
      column: this.column,
      field: this.field,
      code: this.code,
      message: this.detail,
    };
  }

  /** one line, for a terminal */
  toLine(): string {
    return this.message.replace(/[\r\n]+/g, ' ');
  }
}

function formatLocation(f: EngineInputErrorFields): string {
  const parts: string[] = [];
  if (f.file) parts.push(f.file + (f.line !== undefined ? `:${f.line}` : ''));
  else if (f.line !== undefined) parts.push(`line ${f.line}`);
  if (f.column !== undefined) parts.push(`column "${f.column}"`);
  if (f.field !== undefined) parts.push(f.field);
  return parts.length ? parts.join(', ') + ': ' : '';
}
