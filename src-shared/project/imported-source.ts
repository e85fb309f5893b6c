import { z } from 'zod';
import { sheetGridSchema } from './sheet-grid';

/**
 * One imported workbook as the project keeps it: enough to recognise the
 * file again (name, size, SHA-256) and every cell it held, so the import can
 * be redone without the original file.
 *
 * The import's reader gives the cells column by column (import/cells.ts);
 * this is the stored form of one whole file.
 */
export const importedSourceSchema = z.object({
  /** Stable id the records refer to. */
  id: z.string().min(1),
  fileName: z.string().min(1),
  size: z.number().int().min(0),
  sha256: z.string().regex(/^[0-9a-f]{64}$/, 'a SHA-256 is 64 lower-case hex digits'),
  importedAt: z.iso.datetime({ offset: true }),
  sheets: z.array(sheetGridSchema),
});

export type ImportedSource = z.infer<typeof importedSourceSchema>;
