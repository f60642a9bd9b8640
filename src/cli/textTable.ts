/**
 * A plain-text table for the terminal: columns padded to their widest cell, numbers (cells that
 * start with a digit, sign or dot) right-aligned.
 */
export function textTable(header: readonly string[], rows: readonly (readonly string[])[], indent = "  "): string {
  const widths = header.map((cell, column) => Math.max(cell.length, ...rows.map((row) => (row[column] ?? "").length)));
  const isNumeric = (text: string): boolean => /^[-+−]?\.?[0-9<]/.test(text);
  const line = (cells: readonly string[]): string =>
    indent +
    cells
      .map((cell, column) => {
        const width = widths[column] ?? cell.length;
        return isNumeric(cell) ? cell.padStart(width) : cell.padEnd(width);
      })
      .join("  ")
      .trimEnd();
  return [line(header), ...rows.map(line)].join("\n");
}

/** A number with a fixed number of decimals, or "—" when it could not be computed. */
export function fixed(value: number | null | undefined, digits: number): string {
  return value === null || value === undefined || !Number.isFinite(value) ? "—" : value.toFixed(digits);
}

/** A p-value for people: "< 0.0001" below 1e-4, otherwise 2 significant digits. */
export function formatP(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (value < 1e-4) return "< 0.0001";
  return value < 0.001 ? value.toFixed(4) : value.toPrecision(2);
}
