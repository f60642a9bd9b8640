import { echoText } from "./limits.js";
import type { ProblemList } from "./InputError.js";

/** One data row of a table file: its first physical line and its fields by column name (trimmed). */
export interface CsvRow {
  /** 1-based physical line where the record starts. */
  readonly line: number;
  /** The trimmed text of a column; "" for a column the file does not have. */
  field(column: string): string;
}

/** How the fields of a table file are separated. */
export type TableLayout = "comma" | "whitespace";

/** A table file read into its header and rows. */
export interface CsvTable {
  /** Column names as written in the header, trimmed. */
  readonly columns: readonly string[];
  /** 1-based line of the header. */
  readonly headerLine: number;
  readonly rows: readonly CsvRow[];
  /** Comma-separated (RFC 4180 CSV) or whitespace-separated text; "comma" unless the caller allowed whitespace. */
  readonly layout?: TableLayout;
}

/** Options of {@link readCsvTable}. */
export interface TableOptions {
  /**
   * Also read a whitespace-separated text table (as climate centres publish index tables). Such a
   * file is recognised by its header line, the first line that is neither blank nor a `#` line:
   * it has no comma and no double quote. Fields are then separated by runs of spaces and tabs,
   * lines starting with `#` are comments and skipped, there is no quoting, and a row may stop
   * early (the columns it does not reach are empty). Default false.
   */
  readonly whitespace?: boolean;
}

const utf8 = new TextDecoder("utf-8", { fatal: true });

/** 1-based line number of a byte offset: one more than the line feeds before it. */
function lineOfByte(bytes: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset; i++) if (bytes[i] === 0x0a) line++;
  return line;
}

/** The first line whose bytes are not valid UTF-8, or null when the whole text is valid. */
function firstInvalidUtf8Line(bytes: Uint8Array): number | null {
  try {
    utf8.decode(bytes);
    return null;
  } catch {
    let start = 0;
    let line = 1;
    for (let i = 0; i <= bytes.length; i++) {
      if (i === bytes.length || bytes[i] === 0x0a) {
        try {
          utf8.decode(bytes.subarray(start, i));
        } catch {
          return line;
        }
        start = i + 1;
        line++;
      }
    }
    return 1;
  }
}

const quote = (text: string): string => `"${echoText(text).replaceAll('"', '\\"')}"`;

interface RawRecord {
  readonly fields: string[];
  /** Physical line where the record starts. */
  readonly line: number;
  /** The record starts with `#`. */
  readonly comment: boolean;
}

interface SplitResult {
  readonly records: RawRecord[];
  readonly error: { readonly line: number; readonly message: string } | null;
}

const CR = 13;
const LF = 10;
const COMMA = 44;
const QUOTE = 34;
const SPACE = 32;
const TAB = 9;

/**
 * RFC 4180 record splitter that counts physical lines itself: CRLF, LF and a lone CR each end one
 * line, inside quoted fields too, so a record's line is the physical line where it starts. Blank
 * lines (nothing or only spaces and tabs) are skipped. Stops at the first quoting error.
 */
function splitCsv(text: string): SplitResult {
  const records: RawRecord[] = [];
  const n = text.length;
  let i = 0;
  let line = 1;
  /** Consumes one line break at position k (CRLF counts once); returns the position after it. */
  const lineBreak = (k: number): number => {
    line++;
    return text.charCodeAt(k) === CR && text.charCodeAt(k + 1) === LF ? k + 2 : k + 1;
  };
  while (i < n) {
    const recordLine = line;
    const fields: string[] = [];
    let onlyBlank = true;
    for (;;) {
      let j = i;
      while (j < n && (text.charCodeAt(j) === SPACE || text.charCodeAt(j) === TAB)) j++;
      if (j < n && text.charCodeAt(j) === QUOTE) {
        onlyBlank = false;
        const quoteLine = line;
        let value = "";
        j++;
        for (;;) {
          const close = text.indexOf('"', j);
          if (close < 0) {
            const message =
              quoteLine === recordLine
                ? "a quoted field opened on this line is not closed before the end of the file"
                : `the record starting on this line has a quoted field opened on line ${quoteLine} that is not closed before the end of the file`;
            return { records, error: { line: recordLine, message } };
          }
          for (let k = j; k < close; k++) {
            const code = text.charCodeAt(k);
            if (code === LF || (code === CR && text.charCodeAt(k + 1) !== LF)) line++;
          }
          value += text.slice(j, close);
          if (text.charCodeAt(close + 1) === QUOTE) {
            value += '"';
            j = close + 2;
            continue;
          }
          j = close + 1;
          break;
        }
        while (j < n && (text.charCodeAt(j) === SPACE || text.charCodeAt(j) === TAB)) j++;
        fields.push(value);
        const after = text.charCodeAt(j);
        if (j < n && after === COMMA) {
          i = j + 1;
          continue;
        }
        if (j >= n || after === CR || after === LF) {
          i = j >= n ? n : lineBreak(j);
          break;
        }
        return { records, error: { line, message: "a closing quote must be followed by a comma or the end of the line" } };
      }
      let k = j;
      while (k < n) {
        const code = text.charCodeAt(k);
        if (code === COMMA || code === CR || code === LF) break;
        if (code === QUOTE) {
          return { records, error: { line, message: 'a double quote inside an unquoted field: put the whole field in quotes and write the quote twice ("")' } };
        }
        k++;
      }
      if (k > j) onlyBlank = false;
      fields.push(text.slice(i, k));
      if (k < n && text.charCodeAt(k) === COMMA) {
        onlyBlank = false;
        i = k + 1;
        continue;
      }
      i = k >= n ? n : lineBreak(k);
      break;
    }
    if (onlyBlank) continue;
    const first = fields[0] ?? "";
    records.push({ fields, line: recordLine, comment: first.trimStart().startsWith("#") });
  }
  return { records, error: null };
}

/** Whitespace-table splitter: one record per physical line, fields split on runs of spaces and tabs. */
function splitWhitespace(text: string): SplitResult {
  const records: RawRecord[] = [];
  let line = 0;
  for (const physical of text.split(/\r\n|\n|\r/)) {
    line++;
    const trimmed = physical.trim();
    if (trimmed === "") continue;
    if (trimmed.startsWith("#")) continue;
    records.push({ fields: trimmed.split(/[ \t]+/), line, comment: false });
  }
  return { records, error: null };
}

/** The first line that is neither blank nor a `#` line has no comma and no double quote. */
function looksWhitespaceSeparated(text: string): boolean {
  let start = 0;
  while (start < text.length) {
    let end = text.indexOf("\n", start);
    if (end < 0) end = text.length;
    const carriage = text.indexOf("\r", start);
    if (carriage >= 0 && carriage < end) end = carriage;
    const physical = text.slice(start, end).trim();
    if (physical !== "" && !physical.startsWith("#")) return !physical.includes(",") && !physical.includes('"');
    start = end + 1;
  }
  return false;
}

/** A data row holding its fields and the header's column positions (shared by all rows). */
class TableRow implements CsvRow {
  constructor(
    readonly line: number,
    private readonly fields: readonly string[],
    private readonly positions: ReadonlyMap<string, number>,
  ) {}

  field(column: string): string {
    const position = this.positions.get(column);
    return position === undefined ? "" : (this.fields[position] ?? "").trim();
  }
}

/**
 * Table reader: checks that a file is UTF-8 text (a BOM is allowed), splits it into records as
 * RFC 4180 CSV (comma separated; double-quoted fields may hold commas, doubled quotes and line
 * breaks; CRLF, LF or CR line ends; blank lines skipped) or, when `options.whitespace` allows it
 * and the header line has no comma, as a whitespace-separated table; checks the header and gives
 * each record the physical line where it starts. Column names and fields are trimmed; columns
 * beyond the required ones are allowed and ignored by the callers.
 *
 * Problems are added to `problems` (never thrown): an empty file, NUL bytes or invalid UTF-8
 * (with the line), `#` comment lines in a CSV file, the first quoting error (an unclosed quote is
 * reported at the line where its record starts, naming the line where the quote opened), a
 * header missing a required column or naming one twice, and a row with a different number of
 * fields than the header. Excerpts of the file in messages are short and have control
 * characters escaped.
 *
 * @param bytes - the file's content
 * @param required - column names the file must have (exact, after trimming)
 * @param problems - where problems of this file are collected
 * @param options - see {@link TableOptions}
 * @returns the table, or null when the file cannot be read as a table at all (the rows with a
 *   wrong number of fields or a comment are left out of a returned table)
 * @example
 * readCsvTable(Buffer.from("site,year\nA,1750\n"), ["site", "year"], new ProblemList("events.csv"))
 *   ?.rows[0]?.field("year"); // => "1750"
 */
export function readCsvTable(bytes: Uint8Array, required: readonly string[], problems: ProblemList, options: TableOptions = {}): CsvTable | null {
  if (bytes.length === 0) {
    problems.add(null, "the file is empty");
    return null;
  }
  const nul = bytes.indexOf(0);
  if (nul >= 0) {
    problems.add(lineOfByte(bytes, nul), "the file is not text (found a NUL byte)");
    return null;
  }
  const badLine = firstInvalidUtf8Line(bytes);
  if (badLine !== null) {
    problems.add(badLine, "the file is not UTF-8 text (found an invalid byte sequence)");
    return null;
  }
  let text = utf8.decode(bytes);
  if (text.startsWith("\uFEFF")) text = text.slice(1);
  if (text.trim() === "") {
    problems.add(null, "the file is empty");
    return null;
  }

  const layout: TableLayout = options.whitespace === true && looksWhitespaceSeparated(text) ? "whitespace" : "comma";
  const { records, error } = layout === "whitespace" ? splitWhitespace(text) : splitCsv(text);
  if (error !== null) {
    // After a quoting error the start of the following records is unknown: report this one only.
    problems.add(error.line, error.message);
    return null;
  }

  const dataRows: RawRecord[] = [];
  for (const row of records) {
    if (row.comment) problems.add(row.line, `comment lines are not allowed (found ${quote(row.fields.join(","))})`);
    else dataRows.push(row);
  }
  const header = dataRows.shift();
  if (header === undefined) {
    problems.add(null, "the file has no header row");
    return null;
  }
  const columns = header.fields.map((name) => name.trim());
  const seen = new Map<string, number>();
  let headerOk = true;
  columns.forEach((name, position) => {
    if (name === "") {
      problems.add(header.line, `column ${position + 1} of the header has no name`);
      headerOk = false;
    } else if (seen.has(name)) {
      problems.add(header.line, `column ${quote(name)} appears twice in the header`);
      headerOk = false;
    }
    seen.set(name, position);
  });
  for (const name of required) {
    if (!seen.has(name)) {
      problems.add(header.line, `missing column "${name}" (found columns: ${listColumns(columns)})`);
      headerOk = false;
    }
  }
  if (!headerOk) return null;

  const rows: CsvRow[] = [];
  for (const row of dataRows) {
    const short = layout === "whitespace" && row.fields.length < columns.length;
    if (row.fields.length !== columns.length && !short) {
      problems.add(row.line, `expected ${columns.length} fields as in the header, found ${row.fields.length}`);
      continue;
    }
    rows.push(new TableRow(row.line, row.fields, seen));
  }
  if (rows.length === 0 && problems.size === 0) problems.add(null, "the file has a header but no data rows");
  return { columns, headerLine: header.line, rows, layout };
}

/**
 * The header's columns for a message: at most 20, each a short excerpt with control characters
 * escaped, then "… (N columns)".
 *
 * @example
 * listColumns(["year", "ENSO"]); // => "year, ENSO"
 */
export function listColumns(columns: readonly string[]): string {
  const shown = columns.slice(0, 20).map((name) => echoText(name));
  return columns.length > 20 ? `${shown.join(", ")}, … (${columns.length} columns)` : shown.join(", ");
}
