/**
 * One problem found in the input of a region: where it is and what is wrong.
 *
 * `file` is the path as the user gave it (the region folder as typed, joined with the file name
 * from region.json), `line` the 1-based physical line in that file, or `null` when the problem
 * concerns the whole file (missing, empty, not text) or no single line.
 */
export interface InputProblem {
  readonly file: string;
  readonly line: number | null;
  readonly message: string;
}

/**
 * Format one problem as the CLI prints it: `file:line: message`, or `file: message` when the
 * problem has no line.
 *
 * @param problem - a problem from an {@link InputError}
 * @returns one line of text without a trailing newline
 * @example
 * formatProblem({ file: "r/fire-sites.csv", line: 4, message: "latitude must be between -90 and 90 (found 95)" });
 * // => "r/fire-sites.csv:4: latitude must be between -90 and 90 (found 95)"
 */
export function formatProblem(problem: InputProblem): string {
  return problem.line === null
    ? `${problem.file}: ${problem.message}`
    : `${problem.file}:${problem.line}: ${problem.message}`;
}

/**
 * Bad input: the region folder cannot be used as it is. Carries every problem found (the reader
 * reports all problems of a file at once, at most {@link MAX_PROBLEMS_PER_FILE} per file plus one
 * "and N more" line). The CLI prints each problem on its own line and exits with code 1.
 */
export class InputError extends Error {
  /** Every problem found, in file order; never empty. */
  readonly problems: readonly InputProblem[];

  /**
   * @param problems - one or more problems; an empty list is a programming error
   * @throws RangeError when `problems` is empty
   */
  constructor(problems: readonly InputProblem[]) {
    if (problems.length === 0) throw new RangeError("InputError needs at least one problem");
    const first = problems[0] as InputProblem;
    const more = problems.length > 1 ? ` (and ${problems.length - 1} more)` : "";
    super(`${formatProblem(first)}${more}`);
    this.name = "InputError";
    this.problems = problems;
  }
}

/** Problems listed per file before the rest are summarised as "and N more problems". */
export const MAX_PROBLEMS_PER_FILE = 20;

/**
 * Collects the problems of one file and caps them at {@link MAX_PROBLEMS_PER_FILE}.
 *
 * @example
 * const problems = new ProblemList("r/fire-events.csv");
 * problems.add(3, "year must be an integer (found \"17x0\")");
 * problems.toArray(); // => [{ file: "r/fire-events.csv", line: 3, message: "year must be …" }]
 */
export class ProblemList {
  /** The problems kept: after a trim, the {@link MAX_PROBLEMS_PER_FILE} with the smallest lines. */
  private items: InputProblem[] = [];
  private total = 0;

  /** @param file - the file as shown to the user */
  constructor(readonly file: string) {}

  /**
   * Record one problem; `line` is 1-based, or null for a whole-file problem. Only the problems
   * that can be shown are kept (a file with a million bad rows does not hold a million messages).
   */
  add(line: number | null, message: string): void {
    this.items.push({ file: this.file, line, message });
    this.total++;
    if (this.items.length > 4 * MAX_PROBLEMS_PER_FILE) this.items = this.sorted().slice(0, MAX_PROBLEMS_PER_FILE);
  }

  /** Number of problems recorded so far (before the cap). */
  get size(): number {
    return this.total;
  }

  /** Kept problems by line, whole-file problems first; a stable sort keeps the order of adding within a line. */
  private sorted(): InputProblem[] {
    return [...this.items].sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
  }

  /**
   * The problems sorted by line (whole-file problems first), capped at
   * {@link MAX_PROBLEMS_PER_FILE}, with a last `file: and N more problems` entry when capped.
   */
  toArray(): InputProblem[] {
    const sorted = this.sorted();
    if (this.total <= MAX_PROBLEMS_PER_FILE) return sorted;
    const kept = sorted.slice(0, MAX_PROBLEMS_PER_FILE);
    const rest = this.total - MAX_PROBLEMS_PER_FILE;
    kept.push({ file: this.file, line: null, message: `and ${rest} more problem${rest === 1 ? "" : "s"}` });
    return kept;
  }
}
