/** Prints rows as left-aligned columns under a header line. */
export function printTable(header: string[], rows: string[][]): void {
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => (r[c] ?? '').length)));
  const line = (cells: string[]) => cells.map((cell, i) => (i === cells.length - 1 ? cell : cell.padEnd(widths[i]))).join('  ');
  console.log(line(header));
  for (const row of rows) console.log(line(row));
}
