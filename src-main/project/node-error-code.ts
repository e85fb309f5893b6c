/** The `code` of a Node system error (`ENOENT`, `EACCES` ...), or undefined for anything else. */
export function nodeErrorCode(err: unknown): string | undefined {
  return typeof err === 'object' && err !== null && 'code' in err ? String((err as { code: unknown }).code) : undefined;
}
