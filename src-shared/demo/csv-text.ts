/** Writes rows as CSV text (comma separated, '.' decimals, quotes where needed, '\n' line ends). */
export function toCsvText(header: readonly string[], rows: readonly (readonly (string | number)[])[]): string {
  const line = (cells: readonly (string | number)[]) => cells.map(csvField).join(',');
  return [line(header), ...rows.map(line)].join('\n') + '\n';
}

function csvField(value: string | number): string {
  const text = typeof value === 'number' ? String(value) : value;
  return /[",\n\r]/.test(text) || text !== text.trim() ? `"${text.replace(/"/g, '""')}"` : text;
}
