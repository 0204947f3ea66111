// Generators of hostile centroid files (fast-check), shared by the engine fuzz test
// (tests/shared/engine/import-fuzz.test.ts) and the load bench's HTTP preview fuzz
// (tests/bench/load.bench.ts): random text and bytes, BOMs, NULs, huge fields, quotes,
// spreadsheet formulas, mixed delimiters, duplicated headers, non-numeric coordinates,
// CR/LF/CRLF and empty lines. Small files, so thousands run in seconds.
import fc from 'fast-check';

const headerCell = fc.constantFrom(
  'Ref', 'Designator', 'RefDes', 'X', 'Y', 'X(mm)', 'Y(mm)', 'Mid X(mil)', 'Mid Y(mil)', 'PosX', 'PosY', 'Rot', 'Rotation', 'Side', 'Layer',
  'Footprint', 'Package', 'Value', 'Val', 'Part Number', 'DNP', 'Fitted', 'X(in)', 'Y(in)', 'Comment', '', '"Ref"', '"X, mm"',
);
const hostileCell = fc.oneof(
  fc.constantFrom('', ' ', 'abc', 'NaN', 'Infinity', '-', '+', '1e309', '-0', '0x10', '1,5', '1.5mm', '2mil', '3in', '12.5 mm', 'top', 'bottom', 'B', 'T', 'yes', 'no', 'maybe'),
  // spreadsheet formulas and the characters the OWASP "CSV Injection" guidance lists
  fc.constantFrom('=1+2', "=cmd|' /C calc'!A0", '=HYPERLINK("http://x","y")', '+SUM(A1)', '-x', '@SUM(1)', '\tR1', '\rR1', '=', '@'),
  // quotes, balanced and not
  fc.constantFrom('"', '""', '"a""b"', '"R1', 'R1"', '"1,5"', '"line\nbreak"', "'"),
  fc.double({ noNaN: false }).map(String),
  fc.integer({ min: -1e6, max: 1e6 }).map(String),
  fc.string({ maxLength: 12 }),
  fc.string({ unit: 'binary', maxLength: 8 }),
  fc.constantFrom('\u0000', 'R\u0000', '\uFEFF', '\uFFFD', 'Ω', '𝑥'),
);
// a huge field (at most one a file, to keep the run short)
const hugeCell = fc.integer({ min: 1000, max: 5000 }).map((n) => 'x'.repeat(n));
const delimiter = fc.constantFrom(',', ';', '\t', '|', ' ');
const lineEnding = fc.constantFrom('\n', '\r\n', '\r');

/** A file that looks like a centroid file, then is spoiled. */
const centroidLike = fc
  .record({
    bom: fc.boolean(),
    preamble: fc.array(fc.constantFrom('', '# exported', 'Units: mm', ';comment', '  '), { maxLength: 3 }),
    header: fc.array(headerCell, { minLength: 1, maxLength: 9 }),
    rows: fc.array(fc.array(hostileCell, { maxLength: 10 }), { maxLength: 14 }),
    delim: delimiter,
    // a few lines get another delimiter
    otherDelim: fc.option(delimiter, { nil: null }),
    eol: lineEnding,
    mixedEol: fc.boolean(),
    trailing: fc.constantFrom('', '\n', '\n\n', '\r\n', '\u0000'),
    huge: fc.oneof({ weight: 9, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: fc.tuple(hugeCell, fc.nat(), fc.nat()) }),
  })
  .map((f) => {
    if (f.huge && f.rows.length) {
      const row = f.rows[f.huge[1] % f.rows.length];
      row[f.huge[2] % (row.length + 1)] = f.huge[0];
    }
    const lines = [...f.preamble, f.header.join(f.delim), ...f.rows.map((r, i) => r.join(f.otherDelim && i % 3 === 2 ? f.otherDelim : f.delim))];
    const text = lines.map((l, i) => l + (f.mixedEol && i % 2 ? '\r\n' : f.eol)).join('') + f.trailing;
    return (f.bom ? '\uFEFF' : '') + text;
  });

/** Good rows with one thing wrong somewhere. */
const mostlyGood = fc
  .record({
    n: fc.integer({ min: 1, max: 12 }),
    at: fc.nat(),
    bad: fc.oneof({ weight: 9, arbitrary: hostileCell }, { weight: 1, arbitrary: hugeCell }),
    col: fc.integer({ min: 0, max: 5 }),
    dupHeader: fc.boolean(),
    eol: lineEnding,
  })
  .map(({ n, at, bad, col, dupHeader, eol }) => {
    const header = ['Ref', 'X(mm)', 'Y(mm)', 'Rot', 'Side', 'Footprint', ...(dupHeader ? ['X'] : [])];
    const rows = Array.from({ length: n }, (_, i) => [`R${i + 1}`, String(i * 1.5), '2.5', '90', i % 2 ? 'bottom' : 'top', 'R0603', ...(dupHeader ? ['7'] : [])]);
    rows[at % n][col] = bad;
    return [header, ...rows].map((r) => r.join(',')).join(eol) + eol;
  });

/** A hostile centroid file as text: mostly centroid-like files spoiled, some random text. */
export const hostileCentroidText = fc.oneof(
  { weight: 5, arbitrary: centroidLike },
  { weight: 3, arbitrary: mostlyGood },
  { weight: 1, arbitrary: fc.string({ maxLength: 300 }) },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 300 }) },
);

/** A hostile upload as bytes: the text above as UTF-8 or Latin-1, or random bytes. */
export const hostileCentroidBytes = fc.oneof(
  { weight: 6, arbitrary: hostileCentroidText.map((t) => Buffer.from(t, 'utf8')) },
  { weight: 2, arbitrary: hostileCentroidText.map((t) => Buffer.from(t, 'latin1')) },
  { weight: 2, arbitrary: fc.uint8Array({ maxLength: 400 }).map((b) => Buffer.from(b)) },
);
