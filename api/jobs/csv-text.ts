import type { CsvCell, CsvTable } from '../../solvers/index.js';

/** One CSV field: numbers as JavaScript prints them (round-trip exact), empty for null. */
function csvField(cell: CsvCell): string {
  if (cell === null) return '';
  const text = String(cell);
  // RFC 4180 §2: a field holding a comma, a quote or a line break is quoted, quotes doubled.
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/**
 * A table as RFC 4180 CSV text: a header line of the column names, then one line per row,
 * each ended by CRLF. Throws RangeError for a row whose length is not the column count, or a
 * non-finite number (a bug: never NaN or Infinity in a response).
 */
export function csvText(table: CsvTable): string {
  const lines = [table.columns.map(csvField).join(',')];
  for (const [index, row] of table.rows.entries()) {
    if (row.length !== table.columns.length) {
      throw new RangeError(
        `csvText: row ${index} has ${row.length} cells for ${table.columns.length} columns`,
      );
    }
    for (const cell of row) {
      if (typeof cell === 'number' && !Number.isFinite(cell)) {
        throw new RangeError(`csvText: non-finite number in row ${index}`);
      }
    }
    lines.push(row.map(csvField).join(','));
  }
  return `${lines.join('\r\n')}\r\n`;
}
