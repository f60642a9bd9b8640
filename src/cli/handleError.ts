import { CommanderError } from "commander";
import { formatProblem, InputError } from "../workspace/InputError.js";
import { EXIT_CODES, UsageError } from "./errors.js";
import { terminalSafe } from "./terminalText.js";

/** Where error messages go; defaults to the process's stderr and environment. */
export interface ErrorOutput {
  readonly writeErr: (text: string) => void;
  /** Print the stack of an internal error (FIREPHASE_DEBUG=1). */
  readonly debug: boolean;
}

const defaultOutput = (): ErrorOutput => ({
  writeErr: (text) => process.stderr.write(text),
  debug: process.env.FIREPHASE_DEBUG === "1",
});

/**
 * Error reporter of the CLI, the only place that turns errors into messages and exit codes:
 * - `InputError` → each problem on its own stderr line, `file:line: message` (or `file: message`), exit 1;
 * - `UsageError` → `firephase: message`, exit 2, then `(run firephase <command> --help for usage)`
 *   when the command is named;
 * - a commander usage error (unknown option, missing argument …) → exit 2 (commander has already
 *   printed its message); help and `--version` → exit 0;
 * - anything else → `firephase: internal error: message`, exit 1, with the stack only when the
 *   environment variable FIREPHASE_DEBUG is 1.
 * Sets `process.exitCode` (never calls `process.exit`) so that output is flushed and tests can run
 * the program in-process.
 *
 * @param error - whatever was thrown
 * Every line is passed through `terminalSafe` (control characters escaped). Data problems keep
 * the file first (`file:line: message`, the form editors and compilers use); every other error
 * line starts with `firephase: `.
 *
 * @param output - where to write (default: stderr, FIREPHASE_DEBUG from the environment)
 * @param command - the command that failed, for the help hint of a usage error
 * @returns the exit code, also stored in `process.exitCode`
 * @example
 * try { await loadWorkspace(region) } catch (error) { handleError(error) } // prints "r/fire-sites.csv:4: …", exit code 1
 */
export function handleError(error: unknown, output: ErrorOutput = defaultOutput(), command?: string): number {
  const code = report(error, { ...output, writeErr: (text) => output.writeErr(terminalSafe(text)) }, command);
  process.exitCode = code;
  return code;
}

function report(error: unknown, output: ErrorOutput, command: string | undefined): number {
  if (error instanceof InputError) {
    for (const problem of error.problems) output.writeErr(`${formatProblem(problem)}\n`);
    return EXIT_CODES.input;
  }
  if (error instanceof UsageError) {
    output.writeErr(`firephase: ${error.message}\n`);
    if (command !== undefined) output.writeErr(`(run firephase ${command} --help for usage)\n`);
    return EXIT_CODES.usage;
  }
  if (error instanceof CommanderError) {
    return error.exitCode === 0 ? EXIT_CODES.ok : EXIT_CODES.usage;
  }
  const message = error instanceof Error ? error.message : String(error);
  output.writeErr(`firephase: internal error: ${message}\n`);
  if (output.debug && error instanceof Error && error.stack !== undefined) output.writeErr(`${error.stack}\n`);
  return EXIT_CODES.input;
}
