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
  /** The data rows in file order, each cut out of the text when the iteration reaches it. */
  readonly rows: Iterable<CsvRow>;
  /** Number of data rows. */
  readonly rowCount: number;
  /** Comma-separated (RFC 4180 CSV) or whitespace-separated text; "comma" unless the caller allowed whitespace. */
  readonly layout: TableLayout;
  /** 1-based physical line where data row `row` (0 … rowCount − 1, file order) starts. */
  lineOf(row: number): number;
  /**
   * A reader of some columns, for a caller that reads every row: `read(row, into)` writes the
   * trimmed text of `columns[j]` in data row `row` to `into[j]` ("" for a column the row does not
   * reach or the header does not have), the same text as `field(columns[j])` of that row, without
   * an object per row.
   */
  columnReader(columns: readonly string[]): (row: number, into: string[]) => void;
  /**
   * Fast path for a reader of numbers: the values of `columns` in every data row, row by row
   * (`values[row × columns.length + j]`, Infinity for an empty cell), when every such cell is written
   * plainly; otherwise null, and the caller reads the rows with {@link columnReader}. Plainly
   * written: an integer column's cell is `-?` and 1–15 digits without a leading zero; a decimal
   * column's cell is the same, optionally followed by `.` and 1–15 digits, or empty; no spaces.
   * For such a cell `readInteger` and `readNumber` (fields.ts) give exactly this value and no
   * problem. Only a CSV text without double quotes whose data rows follow one another, one per
   * line, is read this way.
   */
  plainNumbers(columns: readonly PlainColumn[]): Float64Array | null;
}

/** A column for {@link CsvTable.plainNumbers}. */
export interface PlainColumn {
  readonly name: string;
  readonly integer: boolean;
}

const PLAIN_INTEGER_CELL = "-?(?:0|[1-9]\\d{0,14})";
const PLAIN_DECIMAL_CELL = `(?:${PLAIN_INTEGER_CELL}(?:\\.\\d{1,15})?)?`;
const ANY_CELL = "[^,\\r\\n]*";

/**
 * See {@link CsvTable.plainNumbers}: `lines` is the text of the data rows (one per line, CRLF or
 * LF), `header` the column names. Each row is matched by one regular expression (in sticky,
 * global mode, so the rows must follow one another); a row that does not match stops it. The
 * wanted cells become a JSON array of numbers (an empty cell 1e999, read as Infinity, which no
 * plain cell can be) that `JSON.parse` reads: the built-in code does the work that a loop over
 * every character and cell would do far more slowly while the reader is not yet compiled. JSON
 * reads a number as `Number` does (the nearest double), so the values are those of the general
 * path. When the wanted columns are the whole header in its order, the rows are checked without
 * captures and the line feeds become the commas (a CR before one is white space in JSON);
 * otherwise each row is replaced by its wanted cells.
 */
function plainNumbersOf(lines: string, rowCount: number, header: readonly string[], wanted: readonly PlainColumn[]): Float64Array | null {
  const slotOf = new Map<string, number>();
  wanted.forEach((column, slot) => slotOf.set(column.name, slot));
  // Each wanted column once, in the header, and at most 99 of them ($1 … $99 in the replacement).
  if (slotOf.size !== wanted.length || wanted.length > 99 || wanted.some((column) => !header.includes(column.name))) return null;
  const whole = wanted.length === header.length && wanted.every((column, position) => column.name === header[position]);
  const groupOfSlot = new Array<number>(wanted.length);
  let groups = 0;
  const cells = header.map((name) => {
    const slot = slotOf.get(name);
    if (slot === undefined) return ANY_CELL;
    groupOfSlot[slot] = ++groups;
    const cell = (wanted[slot] as PlainColumn).integer ? PLAIN_INTEGER_CELL : PLAIN_DECIMAL_CELL;
    return whole ? cell : `(${cell})`;
  });
  const row = new RegExp(`${cells.join(",")}\\r?\\n`, "gy");
  const text = lines.endsWith("\n") ? lines : `${lines}\n`;
  let joined: string;
  if (whole) {
    if (text.replace(row, "") !== "") return null;
    joined = text.replaceAll("\n", ",");
  } else {
    joined = text.replace(row, groupOfSlot.map((group) => `$${group},`).join(""));
    // A row that is not plain is left as it was, with its line feed.
    if (joined.includes("\n")) return null;
  }
  // Every cell now ends with a comma (and maybe a CR); with one more comma in front, an empty cell
  // is a comma followed by a comma.
  const numbers = `,${joined}`;
  const filled = numbers.includes(",,") || numbers.includes(",\r,") ? numbers.replace(/,(?=\r?,)/g, ",1e999") : numbers;
  const parsed = JSON.parse(`[${filled.slice(1, -1)}]`) as number[];
  return parsed.length === rowCount * wanted.length ? new Float64Array(parsed) : null;
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

/** A sequence of integers read by position (a record's offset, line or field count). */
interface IntSequence {
  readonly length: number;
  at(index: number): number;
}

/** A growable list of 32-bit integers, far smaller than objects per record. */
class IntList implements IntSequence {
  private data = new Int32Array(1024);
  length = 0;

  push(value: number): void {
    if (this.length === this.data.length) {
      const grown = new Int32Array(this.data.length * 2);
      grown.set(this.data);
      this.data = grown;
    }
    this.data[this.length++] = value;
  }

  at(index: number): number {
    return this.data[index] as number;
  }
}

/** first, first + step, first + 2 × step, … (`length` of them). */
class Arithmetic implements IntSequence {
  constructor(
    readonly length: number,
    private readonly first: number,
    private readonly step: number,
  ) {}

  at(index: number): number {
    return this.first + index * this.step;
  }
}

/** Where each of the first `length` lines of a text starts, found when first asked for. */
class LineStarts implements IntSequence {
  private starts: IntList | null = null;

  constructor(
    private readonly text: string,
    readonly length: number,
  ) {}

  at(index: number): number {
    if (this.starts === null) {
      const starts = new IntList();
      for (let start = 0; starts.length < this.length; start = this.text.indexOf("\n", start) + 1) starts.push(start);
      this.starts = starts;
    }
    return this.starts.at(index);
  }
}

/**
 * Where each record of a file starts: its offset in the text, its physical line and its number of
 * fields. Fields are cut out only when a row is reached, so a file of millions of rows does not
 * hold millions of objects at once.
 */
interface RecordIndex {
  readonly offsets: IntSequence;
  readonly lines: IntSequence;
  /** Number of fields; negative for a `#` comment line of a CSV file. */
  readonly counts: IntSequence;
  readonly error: { readonly line: number; readonly message: string } | null;
  /** One record per physical line, without double quotes (see {@link indexPlainCsv}). */
  readonly plain: boolean;
  /**
   * For a text whose first line is its header and whose every other line is a data row of as
   * many fields (see {@link indexUniformCsv}): where the data rows' text starts and ends; else null.
   */
  readonly uniform: { readonly start: number; readonly end: number } | null;
}

const CR = 13;
const LF = 10;
const COMMA = 44;
const QUOTE = 34;
const SPACE = 32;
const TAB = 9;
const HASH = 35;

/** What {@link readCsvRecord} found: one object, overwritten by every call (read it before the next). */
const RECORD = {
  /** Position after the record and its line break. */
  next: 0,
  /** Physical line after the record. */
  line: 0,
  fieldCount: 0,
  /** Nothing but spaces and tabs: a blank line. */
  blank: true,
  error: null as { line: number; message: string } | null,
};

/** Position after the line break at `k` (CRLF counts once). */
const afterBreak = (text: string, k: number): number => (text.charCodeAt(k) === CR && text.charCodeAt(k + 1) === LF ? k + 2 : k + 1);

function endRecord(next: number, line: number, fieldCount: number, blank: boolean, error: { line: number; message: string } | null): typeof RECORD {
  RECORD.next = next;
  RECORD.line = line;
  RECORD.fieldCount = fieldCount;
  RECORD.blank = blank;
  RECORD.error = error;
  return RECORD;
}

/**
 * Reads one RFC 4180 record starting at `start` on physical line `startLine`. CRLF, LF and a lone
 * CR each end one physical line, inside quoted fields too. With `fields` given, the fields' text
 * is pushed onto it (unquoted, doubled quotes made single); without, only counted. The result is
 * the shared {@link RECORD}.
 */
function readCsvRecord(text: string, start: number, startLine: number, fields: string[] | null): typeof RECORD {
  const n = text.length;
  let i = start;
  let line = startLine;
  let fieldCount = 0;
  let blank = true;
  for (;;) {
    let j = i;
    while (j < n && (text.charCodeAt(j) === SPACE || text.charCodeAt(j) === TAB)) j++;
    if (j < n && text.charCodeAt(j) === QUOTE) {
      blank = false;
      const quoteLine = line;
      let value = "";
      j++;
      for (;;) {
        const close = text.indexOf('"', j);
        if (close < 0) {
          const message =
            quoteLine === startLine
              ? "a quoted field opened on this line is not closed before the end of the file"
              : `the record starting on this line has a quoted field opened on line ${quoteLine} that is not closed before the end of the file`;
          return endRecord(n, line, fieldCount, blank, { line: startLine, message });
        }
        for (let k = j; k < close; k++) {
          const code = text.charCodeAt(k);
          if (code === LF || (code === CR && text.charCodeAt(k + 1) !== LF)) line++;
        }
        if (fields !== null) value += text.slice(j, close);
        if (text.charCodeAt(close + 1) === QUOTE) {
          if (fields !== null) value += '"';
          j = close + 2;
          continue;
        }
        j = close + 1;
        break;
      }
      while (j < n && (text.charCodeAt(j) === SPACE || text.charCodeAt(j) === TAB)) j++;
      fieldCount++;
      if (fields !== null) fields.push(value);
      const after = text.charCodeAt(j);
      if (j < n && after === COMMA) {
        i = j + 1;
        continue;
      }
      if (j >= n || after === CR || after === LF) {
        if (j >= n) return endRecord(n, line, fieldCount, blank, null);
        return endRecord(afterBreak(text, j), line + 1, fieldCount, blank, null);
      }
      return endRecord(n, line, fieldCount, blank, { line, message: "a closing quote must be followed by a comma or the end of the line" });
    }
    let k = j;
    while (k < n) {
      const code = text.charCodeAt(k);
      if (code === COMMA || code === CR || code === LF) break;
      if (code === QUOTE) {
        return endRecord(n, line, fieldCount, blank, {
          line,
          message: 'a double quote inside an unquoted field: put the whole field in quotes and write the quote twice ("")',
        });
      }
      k++;
    }
    if (k > j) blank = false;
    fieldCount++;
    if (fields !== null) fields.push(text.slice(i, k));
    if (k < n && text.charCodeAt(k) === COMMA) {
      blank = false;
      i = k + 1;
      continue;
    }
    if (k >= n) return endRecord(n, line, fieldCount, blank, null);
    return endRecord(afterBreak(text, k), line + 1, fieldCount, blank, null);
  }
}

/** Finds every record of a CSV text (blank lines skipped); stops at the first quoting error. */
function indexCsv(text: string): RecordIndex {
  const offsets = new IntList();
  const lines = new IntList();
  const counts = new IntList();
  let i = 0;
  let line = 1;
  while (i < text.length) {
    const record = readCsvRecord(text, i, line, null);
    if (record.error !== null) return { offsets, lines, counts, error: record.error, plain: false, uniform: null };
    if (!record.blank) {
      let first = i;
      while (text.charCodeAt(first) === SPACE || text.charCodeAt(first) === TAB) first++;
      offsets.push(i);
      lines.push(line);
      counts.push(text.charCodeAt(first) === HASH ? -1 : record.fieldCount);
    }
    i = record.next;
    line = record.line;
  }
  return { offsets, lines, counts, error: null, plain: false, uniform: null };
}

/**
 * The record index of a CSV text with no double quote and no CR other than that of a CRLF, or
 * null for any other text. Such a text has one record per physical line and a record's fields are
 * its text between commas, so the records are found with the built-in `indexOf` (far quicker than
 * a scan character by character while the reader is not yet compiled). Gives the same records as
 * {@link indexCsv}; the fields are cut out later by {@link plainCsvFields}.
 */
function indexPlainCsv(text: string): RecordIndex | null {
  if (text.includes('"')) return null;
  for (let at = text.indexOf("\r"); at >= 0; at = text.indexOf("\r", at + 1)) if (text.charCodeAt(at + 1) !== LF) return null;
  const uniform = indexUniformCsv(text);
  if (uniform !== null) return uniform;
  const offsets = new IntList();
  const lines = new IntList();
  const counts = new IntList();
  let line = 1;
  // The next comma at or after the current line (each search starts where the last one ended).
  let comma = text.indexOf(",");
  for (let start = 0; start < text.length; line++) {
    const feed = text.indexOf("\n", start);
    const next = feed < 0 ? text.length : feed + 1;
    const end = feed < 0 ? text.length : feed > start && text.charCodeAt(feed - 1) === CR ? feed - 1 : feed;
    let first = start;
    while (first < end && (text.charCodeAt(first) === SPACE || text.charCodeAt(first) === TAB)) first++;
    let commas = 0;
    while (comma >= 0 && comma < end) {
      commas++;
      comma = text.indexOf(",", comma + 1);
    }
    // Only spaces and tabs: a blank line, skipped.
    if (first < end || commas > 0) {
      offsets.push(start);
      lines.push(line);
      counts.push(first < end && text.charCodeAt(first) === HASH ? -1 : commas + 1);
    }
    start = next;
  }
  return { offsets, lines, counts, error: null, plain: true, uniform: null };
}

/**
 * The record index of a text that {@link indexPlainCsv} accepts, when its first line is the
 * header (no leading space, tab or `#`) and every later line, up to the last that is not blank,
 * is a data row with as many fields as the header and neither blank nor a `#` line; otherwise
 * null. One regular expression checks all the rows (in sticky, global mode: each row must follow
 * the one before), so nothing is done per line in JavaScript; where each line starts is found only
 * if a caller asks (see {@link LineStarts}).
 */
function indexUniformCsv(text: string): RecordIndex | null {
  const first = text.charCodeAt(0);
  if (first === SPACE || first === TAB || first === HASH || first === CR || first === LF || text.length === 0) return null;
  const feed = text.indexOf("\n");
  if (feed < 0) return null;
  const headerEnd = text.charCodeAt(feed - 1) === CR ? feed - 1 : feed;
  let commas = 0;
  for (let comma = text.indexOf(","); comma >= 0 && comma < headerEnd; comma = text.indexOf(",", comma + 1)) commas++;
  // The data rows: from the second line to the end of the last line that is not blank.
  const start = feed + 1;
  let end = text.length;
  while (end > start && (text.charCodeAt(end - 1) === SPACE || text.charCodeAt(end - 1) === TAB || text.charCodeAt(end - 1) === CR || text.charCodeAt(end - 1) === LF)) end--;
  if (end === start) return null;
  const rest = text.slice(start, end);
  const row = new RegExp(`(?![ \\t]*(?:#|\\r?\\n))[^,\\r\\n]*(?:,[^,\\r\\n]*){${commas}}\\r?\\n`, "gy");
  if (`${rest}\n`.replace(row, "") !== "") return null;
  const records = 2 + (rest.match(/\n/g)?.length ?? 0);
  const lastFeed = text.indexOf("\n", end);
  return {
    offsets: new LineStarts(text, records),
    lines: new Arithmetic(records, 1, 1),
    counts: new Arithmetic(records, commas + 1, 0),
    error: null,
    plain: true,
    uniform: { start, end: lastFeed < 0 ? text.length : lastFeed + 1 },
  };
}

/** The fields of the record at `start` of a text that {@link indexPlainCsv} indexed. */
function plainCsvFields(text: string, start: number): string[] {
  const feed = text.indexOf("\n", start);
  const end = feed < 0 ? text.length : feed > start && text.charCodeAt(feed - 1) === CR ? feed - 1 : feed;
  return text.slice(start, end).split(",");
}

/** End of the physical line starting at `start` (the position of its CR or LF, or the end). */
function lineEnd(text: string, start: number): number {
  let k = start;
  while (k < text.length) {
    const code = text.charCodeAt(k);
    if (code === LF || code === CR) return k;
    k++;
  }
  return k;
}

/** Fields of one whitespace-table line: split on runs of spaces and tabs. */
const whitespaceFields = (text: string, start: number): string[] => text.slice(start, lineEnd(text, start)).trim().split(/[ \t]+/);

/** Finds every line of a whitespace table that is neither blank nor a `#` comment. */
function indexWhitespace(text: string): RecordIndex {
  const offsets = new IntList();
  const lines = new IntList();
  const counts = new IntList();
  let i = 0;
  let line = 1;
  while (i < text.length) {
    const end = lineEnd(text, i);
    let first = i;
    while (first < end && (text.charCodeAt(first) === SPACE || text.charCodeAt(first) === TAB)) first++;
    if (first < end && text.charCodeAt(first) !== HASH) {
      let fields = 0;
      let inField = false;
      for (let k = first; k < end; k++) {
        const space = text.charCodeAt(k) === SPACE || text.charCodeAt(k) === TAB;
        if (!space && !inField) fields++;
        inField = !space;
      }
      offsets.push(i);
      lines.push(line);
      counts.push(fields);
    }
    line++;
    i = end >= text.length ? text.length : afterBreak(text, end);
  }
  return { offsets, lines, counts, error: null, plain: false, uniform: null };
}

/** The first line that is neither blank nor a `#` line has no comma and no double quote. */
function looksWhitespaceSeparated(text: string): boolean {
  let start = 0;
  while (start < text.length) {
    const end = lineEnd(text, start);
    const physical = text.slice(start, end).trim();
    if (physical !== "" && !physical.startsWith("#")) return !physical.includes(",") && !physical.includes('"');
    start = end >= text.length ? text.length : afterBreak(text, end);
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

/** Whether a character is printable ASCII other than space: never white space, never trimmed. */
const isPlainCode = (code: number): boolean => code > SPACE && code < 127;

/** `text.slice(start, end).trim()`, without the second string when nothing is to be trimmed. */
function trimmedSlice(text: string, start: number, end: number): string {
  if (end > start && isPlainCode(text.charCodeAt(start)) && isPlainCode(text.charCodeAt(end - 1))) return text.slice(start, end);
  return text.slice(start, end).trim();
}

/**
 * Reads the wanted fields of the CSV record at `start` into `into` (`wanted[f]` = the slot of
 * field f, or −1). Fast path for a record without a double quote; returns false for a record
 * with one (the caller then splits it with {@link readCsvRecord}).
 */
function readPlainCsvFields(text: string, start: number, wanted: Int32Array, into: string[]): boolean {
  const n = text.length;
  let field = 0;
  let fieldStart = start;
  for (let i = start; ; i++) {
    const code = i < n ? text.charCodeAt(i) : LF;
    if (code === COMMA || code === LF || code === CR) {
      const slot = field < wanted.length ? (wanted[field] as number) : -1;
      if (slot >= 0) into[slot] = trimmedSlice(text, fieldStart, i);
      if (code !== COMMA) return true;
      field++;
      fieldStart = i + 1;
    } else if (code === QUOTE) {
      return false;
    }
  }
}

/**
 * Reads the wanted fields of the whitespace-table line at `start` into `into`. Fast path for a
 * line of printable ASCII, spaces and tabs; returns false for a line with any other character
 * (the caller then splits it as {@link whitespaceFields} does, which trims Unicode white space).
 */
function readPlainWhitespaceFields(text: string, start: number, wanted: Int32Array, into: string[]): boolean {
  const n = text.length;
  let field = 0;
  let fieldStart = -1;
  for (let i = start; ; i++) {
    const code = i < n ? text.charCodeAt(i) : LF;
    if (code === SPACE || code === TAB || code === LF || code === CR) {
      if (fieldStart >= 0) {
        const slot = field < wanted.length ? (wanted[field] as number) : -1;
        if (slot >= 0) into[slot] = text.slice(fieldStart, i);
        field++;
        fieldStart = -1;
      }
      if (code === LF || code === CR) return true;
    } else if (isPlainCode(code)) {
      if (fieldStart < 0) fieldStart = i;
    } else {
      return false;
    }
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
 *   ?.rowCount; // => 1
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
  let text: string;
  try {
    text = utf8.decode(bytes);
  } catch {
    problems.add(firstInvalidUtf8Line(bytes), "the file is not UTF-8 text (found an invalid byte sequence)");
    return null;
  }
  if (text.startsWith("\uFEFF")) text = text.slice(1);
  if (text.trim() === "") {
    problems.add(null, "the file is empty");
    return null;
  }

  const layout: TableLayout = options.whitespace === true && looksWhitespaceSeparated(text) ? "whitespace" : "comma";
  const index = layout === "whitespace" ? indexWhitespace(text) : (indexPlainCsv(text) ?? indexCsv(text));
  if (index.error !== null) {
    // After a quoting error the start of the following records is unknown: report this one only.
    problems.add(index.error.line, index.error.message);
    return null;
  }
  const fieldsAt = (record: number): readonly string[] => {
    const offset = index.offsets.at(record);
    if (index.plain) return plainCsvFields(text, offset);
    if (layout === "whitespace") return whitespaceFields(text, offset);
    const fields: string[] = [];
    readCsvRecord(text, offset, index.lines.at(record), fields);
    return fields;
  };

  let headerRecord = index.uniform === null ? -1 : 0;
  for (let record = 0; index.uniform === null && record < index.offsets.length; record++) {
    if (index.counts.at(record) < 0) {
      const shown = fieldsAt(record).join(",");
      problems.add(index.lines.at(record), `comment lines are not allowed (found ${quote(shown)})`);
    } else if (headerRecord < 0) {
      headerRecord = record;
    }
  }
  if (headerRecord < 0) {
    problems.add(null, "the file has no header row");
    return null;
  }
  const headerLine = index.lines.at(headerRecord);
  const columns = fieldsAt(headerRecord).map((name) => name.trim());
  const seen = new Map<string, number>();
  let headerOk = true;
  columns.forEach((name, position) => {
    if (name === "") {
      problems.add(headerLine, `column ${position + 1} of the header has no name`);
      headerOk = false;
    } else if (seen.has(name)) {
      problems.add(headerLine, `column ${quote(name)} appears twice in the header`);
      headerOk = false;
    }
    seen.set(name, position);
  });
  for (const name of required) {
    if (!seen.has(name)) {
      problems.add(headerLine, `missing column "${name}" (found columns: ${listColumns(columns)})`);
      headerOk = false;
    }
  }
  if (!headerOk) return null;

  // A row is kept when it has as many fields as the header (a whitespace row may stop early);
  // every row of a uniform text is.
  let kept: IntSequence = new Arithmetic(index.offsets.length - 1, 1, 1);
  if (index.uniform === null) {
    const list = new IntList();
    for (let record = headerRecord + 1; record < index.offsets.length; record++) {
      const count = index.counts.at(record);
      if (count < 0) continue;
      if (count === columns.length || (layout === "whitespace" && count < columns.length)) list.push(record);
      else problems.add(index.lines.at(record), `expected ${columns.length} fields as in the header, found ${count}`);
    }
    kept = list;
  }
  if (kept.length === 0 && problems.size === 0) problems.add(null, "the file has a header but no data rows");
  const rows: Iterable<CsvRow> = {
    *[Symbol.iterator]() {
      for (let k = 0; k < kept.length; k++) {
        const record = kept.at(k);
        yield new TableRow(index.lines.at(record), fieldsAt(record), seen);
      }
    },
  };
  const columnReader = (wantedColumns: readonly string[]): ((row: number, into: string[]) => void) => {
    // wanted[f] = the slot of header field f; a column asked for twice, or not in the header, is filled separately.
    const wanted = new Int32Array(columns.length).fill(-1);
    const others: number[] = [];
    wantedColumns.forEach((column, slot) => {
      const position = seen.get(column);
      if (position !== undefined && wanted[position] === -1) wanted[position] = slot;
      else others.push(slot);
    });
    return (row, into) => {
      const record = kept.at(row);
      const offset = index.offsets.at(record);
      for (let slot = 0; slot < wantedColumns.length; slot++) into[slot] = "";
      const plain =
        !index.plain && (layout === "whitespace" ? readPlainWhitespaceFields(text, offset, wanted, into) : readPlainCsvFields(text, offset, wanted, into));
      if (!plain) {
        const fields = fieldsAt(record);
        for (let position = 0; position < wanted.length; position++) {
          const slot = wanted[position] as number;
          if (slot >= 0) into[slot] = (fields[position] ?? "").trim();
        }
      }
      for (const slot of others) {
        const position = seen.get(wantedColumns[slot] as string);
        into[slot] = position === undefined ? "" : (into[wanted[position] as number] as string);
      }
    };
  };
  const plainNumbers = (wanted: readonly PlainColumn[]): Float64Array | null => {
    if (index.uniform !== null) return plainNumbersOf(text.slice(index.uniform.start, index.uniform.end), kept.length, columns, wanted);
    if (!index.plain || kept.length === 0) return null;
    // The data rows must be the records after the header, on consecutive lines (no blank line,
    // comment or row of the wrong length among them).
    const first = kept.at(0);
    const last = kept.at(kept.length - 1);
    if (first !== headerRecord + 1 || last - first + 1 !== kept.length || index.lines.at(last) - index.lines.at(first) + 1 !== kept.length) return null;
    const feed = text.indexOf("\n", index.offsets.at(last));
    return plainNumbersOf(text.slice(index.offsets.at(first), feed < 0 ? text.length : feed + 1), kept.length, columns, wanted);
  };
  return { columns, headerLine, rows, rowCount: kept.length, layout, lineOf: (row) => index.lines.at(kept.at(row)), columnReader, plainNumbers };
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
