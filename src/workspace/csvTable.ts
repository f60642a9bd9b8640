import { parse } from "csv-parse/sync";
import type { ProblemList } from "./InputError.js";

/** One data row of a CSV file: its first physical line and its fields by column name (trimmed). */
export interface CsvRow {
  /** 1-based physical line where the record starts. */
  readonly line: number;
  /** The trimmed text of a column; "" for a column the file does not have. */
  readonly field: (column: string) => string;
}

/** A CSV file read into its header and rows. */
export interface CsvTable {
  /** Column names as written in the header, trimmed. */
  readonly columns: readonly string[];
  /** 1-based line of the header. */
  readonly headerLine: number;
  readonly rows: readonly CsvRow[];
}

const LINE_BREAK = /\r\n|\n|\r/g;
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

function csvErrorMessage(code: string | undefined, message: string): string {
  switch (code) {
    case "CSV_INVALID_CLOSING_QUOTE":
      return "a closing quote must be followed by a comma or the end of the line";
    case "CSV_QUOTE_NOT_CLOSED":
      return "a quoted field is not closed before the end of the file";
    case "CSV_MAX_RECORD_SIZE":
      return "a record is too long (more than 128,000 characters)";
    default:
      return `not valid CSV: ${message.replace(/\s+at line \d+.*$/s, "")}`;
  }
}

const quote = (text: string): string => JSON.stringify(text.length > 40 ? `${text.slice(0, 37)}...` : text);

/**
 * CSV table reader: checks that a file is UTF-8 text (a BOM is allowed), parses it as RFC 4180 CSV
 * with csv-parse (comma separated, double-quoted fields may hold commas, quotes and line breaks,
 * CRLF, LF or CR line ends, blank lines skipped), checks the header and gives each record the
 * physical line where it starts. Column names and fields are trimmed; columns beyond the
 * required and optional ones are allowed and ignored by the callers.
 *
 * Problems are added to `problems` (never thrown): an empty file, NUL bytes or invalid UTF-8
 * (with the line), `#` comment lines, quoting errors, a header missing a required column or
 * naming one twice, and a row with a different number of fields than the header.
 *
 * @param bytes - the file's content
 * @param required - column names the file must have
 * @param problems - where problems of this file are collected
 * @returns the table, or null when the file cannot be read as a table at all (the rows with a
 *   wrong number of fields or a comment are left out of a returned table)
 * @example
 * readCsvTable(Buffer.from("site,year\nA,1750\n"), ["site", "year"], new ProblemList("events.csv"))
 *   ?.rows[0]?.field("year"); // => "1750"
 */
export function readCsvTable(bytes: Uint8Array, required: readonly string[], problems: ProblemList): CsvTable | null {
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

  const parseProblems: { line: number | null; message: string }[] = [];
  let records: { record: string[]; raw: string; info: { lines: number } }[];
  try {
    records = parse(text, {
      info: true,
      raw: true,
      relax_column_count: true,
      skip_empty_lines: true,
      record_delimiter: ["\r\n", "\n", "\r"],
      skip_records_with_error: true,
      on_skip: (error) => {
        if (error !== undefined) {
          parseProblems.push({ line: typeof error.lines === "number" ? error.lines : null, message: csvErrorMessage(error.code, error.message) });
        }
        return undefined;
      },
    }) as unknown as { record: string[]; raw: string; info: { lines: number } }[];
  } catch (error) {
    const code = (error as { code?: string }).code;
    const lines = (error as { lines?: unknown }).lines;
    problems.add(typeof lines === "number" ? lines : null, csvErrorMessage(code, String((error as Error).message)));
    return null;
  }
  // After a quoting error csv-parse cannot tell where the following records start, so the errors
  // that follow the first one are mostly echoes of it: report the first only.
  const firstParseProblem = parseProblems[0];
  if (firstParseProblem !== undefined) problems.add(firstParseProblem.line, firstParseProblem.message);

  const located = records.map(({ record, raw, info }) => {
    // `raw` starts with the blank lines skipped before the record and ends with (part of) its line break.
    const own = raw.replace(/^(?:\r\n|\n|\r)+/, "").replace(/(?:\r\n|\n|\r)$/, "");
    const inner = own.match(LINE_BREAK)?.length ?? 0;
    return { fields: record, line: info.lines - inner, raw: own };
  });
  const dataRows: { fields: string[]; line: number }[] = [];
  for (const row of located) {
    if (row.raw.startsWith("#")) {
      problems.add(row.line, `comment lines are not allowed (found ${quote(row.raw)})`);
    } else {
      dataRows.push(row);
    }
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
      problems.add(header.line, `column "${name}" appears twice in the header`);
      headerOk = false;
    }
    seen.set(name, position);
  });
  for (const name of required) {
    if (!seen.has(name)) {
      problems.add(header.line, `missing column "${name}" (found columns: ${columns.join(", ")})`);
      headerOk = false;
    }
  }
  if (!headerOk) return null;

  const rows: CsvRow[] = [];
  for (const row of dataRows) {
    if (row.fields.length !== columns.length) {
      problems.add(row.line, `expected ${columns.length} fields as in the header, found ${row.fields.length}`);
      continue;
    }
    const fields = row.fields;
    rows.push({
      line: row.line,
      field: (column) => {
        const position = seen.get(column);
        return position === undefined ? "" : (fields[position] ?? "").trim();
      },
    });
  }
  if (rows.length === 0 && problems.size === 0) problems.add(null, "the file has a header but no data rows");
  return { columns, headerLine: header.line, rows };
}
