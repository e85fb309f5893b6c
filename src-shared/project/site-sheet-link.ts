import { z } from 'zod';
import { areaUnits } from '../import/units';

/**
 * The project's link to a sheet that lists the sites (one row per site):
 * which imported source and sheet, the row holding the headers, the column
 * with the site names (matched to the records' site after cleaning), the
 * area column with its unit, and the columns carried into the analysis table
 * as site covariates (habitat, altitude ...). Columns are named by their
 * header text as the sheet shows it.
 */
export const siteSheetLinkSchema = z.object({
  sourceId: z.string().min(1),
  sheet: z.string().min(1),
  /** 1-based row of the headers; the sites follow it. */
  headerRow: z.number().int().min(1).default(1),
  siteColumn: z.string().min(1),
  area: z.object({ column: z.string().min(1), unit: z.enum(areaUnits) }).nullable(),
  covariates: z.array(z.string().min(1)).default([]),
});

export type SiteSheetLink = z.infer<typeof siteSheetLinkSchema>;
