/**
 * The committed R reference for the diagnostics (test/reference/diagnostics,
 * made by make-diagnostics.R from MASS's `quine` with R, MASS and statmod;
 * versions in the fixture's `R` and `packages`).
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { DataTable } from '@shared/data/table';
import { tableFromTexts } from '@shared/data/table';
import { fitModel } from '@shared/engine';
import type { FitOutcome } from '@shared/engine';
import { parseModelSpec } from '@shared/model/spec';
import type { Distribution, ModelSpec } from '@shared/model/spec';

const DIR = resolve(__dirname, '../reference/diagnostics');

interface ModelRef {
  coefficients: Record<string, number>;
  theta?: number;
  expectedFrequency: number[];
  cdfLower: number[];
  cdfUpper: number[];
  qresid: { uniforms: number[]; residuals: (number | null)[]; infinite: number[]; accurate: number[] };
}

export interface QuineReference {
  R: string;
  packages: Record<string, string>;
  source: string;
  spec: unknown;
  tolerance: { coefficients: number; frequency: number; quantileResidual: number; cdf: number; meanVariance: number };
  observedFrequency: number[];
  observedZeros: number;
  poisson: ModelRef;
  negbin: ModelRef;
  normalQuantile: { p: number[]; q: number[] };
  meanVariance: { group: string; cells: string[]; n: number[]; mean: number[]; variance: number[] };
}

export const quineRef = JSON.parse(readFileSync(resolve(DIR, 'diagnostics-fixtures.json'), 'utf8')) as QuineReference;

export function quineTable(): DataTable {
  const lines = readFileSync(resolve(DIR, 'quine.csv'), 'utf8').trim().split(/\r?\n/);
  return tableFromTexts(lines[0].split(','), lines.slice(1).map((l) => l.split(',')));
}

export function quineSpec(distribution: Distribution): ModelSpec {
  return parseModelSpec({ ...(quineRef.spec as object), distribution });
}

const cache = new Map<string, FitOutcome>();
export function quineFit(distribution: 'poisson' | 'negbin'): FitOutcome {
  let f = cache.get(distribution);
  if (!f) {
    f = fitModel(quineTable(), quineSpec(distribution));
    cache.set(distribution, f);
  }
  return f;
}
