/**
 * Bad usage: an option or argument value the command cannot use (an unknown index name in
 * `--values`, a malformed date). The CLI prints the message and exits with code 2.
 *
 * @example
 * throw new UsageError('--issued: expected a date as YYYY-MM-DD, found "10/03/2027"');
 */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "UsageError";
  }
}

/** Exit codes of every firephase command. */
export const EXIT_CODES = Object.freeze({
  /** The command did its work. */
  ok: 0,
  /** Bad input or data (the region folder), or an internal error. */
  input: 1,
  /** Bad usage: unknown command or option, a missing argument, a bad option value. */
  usage: 2,
});
