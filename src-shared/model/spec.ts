import { z } from 'zod';

/**
 * The model spec: what to fit. The same object is written in the project
 * file, typed in the model builder and given to the command line as JSON
 * (see shared/cli-contract.md, which fixes this shape).
 */
export const distributions = ['poisson', 'quasipoisson', 'negbin', 'zip', 'zinb', 'hurdle-poisson', 'hurdle-negbin'] as const;
export type Distribution = (typeof distributions)[number];

const numericTerm = z.object({ column: z.string().min(1), type: z.literal('numeric') });
const factorTerm = z.object({ column: z.string().min(1), type: z.literal('factor'), reference: z.string().optional() });
const interactionTerm = z.object({ columns: z.array(z.string().min(1)).length(2), type: z.literal('interaction') });
const splineTerm = z.object({ column: z.string().min(1), type: z.literal('spline'), df: z.number().int().min(1).max(20) });

export const termSchema = z.discriminatedUnion('type', [numericTerm, factorTerm, interactionTerm, splineTerm]);
export type Term = z.infer<typeof termSchema>;

export const offsetSchema = z.object({ column: z.string().min(1), log: z.boolean().default(true) });
export type Offset = z.infer<typeof offsetSchema>;

export const siteSchema = z.object({
  column: z.string().min(1),
  effect: z.enum(['fixed', 'random']),
  quadraturePoints: z.number().int().min(1).max(50).default(9),
});

export const timeSchema = z.object({
  column: z.string().min(1),
  trend: z.enum(['annual', 'linear']),
  base: z.union([z.number(), z.string()]).optional(),
});

export const modelSpecSchema = z.object({
  response: z.string().min(1),
  distribution: z.enum(distributions),
  predictors: z.array(termSchema).default([]),
  offsets: z.array(offsetSchema).default([]),
  zeroPredictors: z.array(termSchema).default([]),
  site: siteSchema.optional(),
  time: timeSchema.optional(),
  robust: z.enum(['site', 'none']).default('none'),
});

/** A spec after defaults are filled in. */
export type ModelSpec = z.infer<typeof modelSpecSchema>;
/** A spec as written by a person (defaults may be missing). */
export type ModelSpecInput = z.input<typeof modelSpecSchema>;

export class SpecError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SpecError';
  }
}

/** Checks a spec object and fills in defaults; throws SpecError naming each fault. */
export function parseModelSpec(input: unknown, where = 'the model spec'): ModelSpec {
  const result = modelSpecSchema.safeParse(input);
  if (result.success) return result.data;
  const faults = result.error.issues.map((i) => {
    const path = i.path.length ? i.path.join('.') : '(top level)';
    return `${path}: ${i.message}`;
  });
  throw new SpecError(`${where} is not valid: ${faults.join('; ')}. See shared/cli-contract.md for the spec's shape.`);
}

export function usesCountDispersion(d: Distribution): boolean {
  return d === 'negbin' || d === 'zinb' || d === 'hurdle-negbin';
}

export function hasZeroPart(d: Distribution): boolean {
  return d === 'zip' || d === 'zinb' || d === 'hurdle-poisson' || d === 'hurdle-negbin';
}
