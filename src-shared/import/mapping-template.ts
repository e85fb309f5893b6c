import { z } from 'zod';
import { fieldCodeRuleSchema } from './field-codes';
import { ImportError } from './import-error';
import { areaUnits, effortUnits } from './units';

/**
 * The mapping template: which column plays which role, saved as JSON so
 * that next season's sheets are read the same way (columns are found by
 * header name, not position).
 */
export const roles = ['site', 'date', 'season', 'visit', 'species', 'count', 'effort', 'area', 'observer', 'covariate', 'ignore'] as const;
export type Role = (typeof roles)[number];

export const columnMapSchema = z.object({
  header: z.string().min(1),
  role: z.enum(roles),
  /** Effort or area unit. */
  unit: z.enum([...effortUnits, ...areaUnits]).optional(),
  /** Wide by species: the species this count column holds (default: its header). */
  species: z.string().optional(),
  /** Wide by visit: the visit this count column holds (default: its header). */
  visit: z.string().optional(),
  /** Covariate name (default: the header). */
  name: z.string().optional(),
});
export type ColumnMap = z.infer<typeof columnMapSchema>;

const monthDay = z.string().regex(/^\d{2}-\d{2}$/, 'use MM-DD, e.g. 03-15');

export const mappingTemplateSchema = z.object({
  kind: z.literal('tallywise-mapping'),
  version: z.literal(1),
  /** The counts sheet (default: the first visible sheet). */
  sheet: z.string().optional(),
  /** long: one count column; wide-species: one count column per species; wide-visit: one count column per visit. */
  layout: z.enum(['long', 'wide-species', 'wide-visit']),
  columns: z.array(columnMapSchema).min(1),
  /** The species when the sheet has no species column and is not wide by species. */
  species: z.string().optional(),
  dateOrder: z.enum(['dmy', 'mdy']).optional(),
  decimalMark: z.enum(['.', ',']).optional(),
  /** Field-code rules replacing the defaults. */
  fieldCodes: z.array(fieldCodeRuleSchema).optional(),
  /** The season's date range as month-day (e.g. 03-01 to 06-30); dates outside it are flagged. */
  seasonWindow: z.object({ from: monthDay, to: monthDay }).optional(),
  /** A sheet of site attributes (area, covariates) joined to the counts by site name. */
  sites: z.object({ sheet: z.string().min(1), columns: z.array(columnMapSchema).min(1) }).optional(),
});
export type MappingTemplate = z.infer<typeof mappingTemplateSchema>;

/** Parses and checks a template; problems become an ImportError naming the template and the field. */
export function parseTemplate(json: unknown, name = 'the mapping template'): MappingTemplate {
  const r = mappingTemplateSchema.safeParse(json);
  if (!r.success) {
    const issues = r.error.issues.slice(0, 3).map((i) => `${i.path.join('.') || '(top level)'}: ${i.message}`).join('; ');
    throw new ImportError('bad-template', `${name} is not a valid mapping template (${issues}). Fix these fields, or save the template again from the mapping screen.`, { file: name });
  }
  const t = r.data;
  const count = t.columns.filter((c) => c.role === 'count');
  const problems: string[] = [];
  if (!t.columns.some((c) => c.role === 'site')) problems.push('no column has the role "site"');
  if (count.length === 0) problems.push('no column has the role "count"');
  if (t.layout === 'long' && count.length > 1) problems.push('a long layout has one count column, but several are given (use "wide-species" or "wide-visit")');
  for (const c of t.columns) {
    if (c.role === 'effort' && c.unit && !(effortUnits as readonly string[]).includes(c.unit)) problems.push(`the effort column "${c.header}" has an area unit (${c.unit})`);
    if (c.role === 'area' && c.unit && !(areaUnits as readonly string[]).includes(c.unit)) problems.push(`the area column "${c.header}" has an effort unit (${c.unit})`);
  }
  if (problems.length) throw new ImportError('bad-template', `${name} cannot be used: ${problems.join('; ')}. Fix the roles in the template.`, { file: name });
  return t;
}
