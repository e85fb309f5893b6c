/** "Counts, row 23, col. G" (with the file when asked): how the Records stage and the export word a place in a workbook. */
export function describePlace(p: { fileName?: string; file?: string; sheet?: string; row?: number; column?: string }, withFile = false): string {
  const parts: string[] = [];
  const file = p.fileName ?? p.file;
  if (withFile && file) parts.push(file);
  if (p.sheet) parts.push(p.sheet);
  if (p.row !== undefined) parts.push(`row ${p.row}`);
  if (p.column) parts.push(`col. ${p.column}`);
  return parts.join(', ');
}
