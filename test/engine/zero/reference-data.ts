/**
 * Loads the committed reference fixtures for the zero-inflated and hurdle
 * tests (made by test/reference/zero/make-zero.R with R and pscl; see the
 * `source` block of zero-fits.json for versions).
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { DataTable } from '@shared/data/table';
import { tableFromTexts } from '@shared/data/table';
import { buildDesign } from '@shared/engine/design/build';
import { frameOptions, modelFrame } from '@shared/engine/frame';
import type { ZeroModelData } from '@shared/engine/zero/likelihood';
import { zeroModelKind } from '@shared/engine/zero/fit-zero';
import type { ModelSpecInput } from '@shared/model/spec';
import { parseModelSpec } from '@shared/model/spec';

const DIR = resolve(__dirname, '../../reference/zero');

export interface RefCoef {
  name: string;
  estimate: number;
  se: number;
}

export interface RefFit {
  id: string;
  source: string;
  spec: ModelSpecInput;
  nobs: number;
  df: number;
  logLik: number;
  aic: number;
  bic: number;
  theta: number | null;
  seLogTheta: number | null;
  count: RefCoef[];
  zero: RefCoef[];
  pearsonChi2: number;
  firstRows: { expected: number[]; probZero: number[]; prob0to6: number[][] };
  clusterSe: { source: string; se: number[]; names: string[]; seNumericalBread: number[] } | null;
  hessianCheck: { logLikHandWritten: number; maxAbsGradient: number; maxRelSeDiff: number; seNumerical: number[] };
}

export interface RefVuong {
  id: string;
  k1: number;
  k2: number;
  n: number;
  logLik1: number[];
  logLik2: number[];
  printedZ: number[];
  stat: number[];
  p: number[];
}

export interface RefScore {
  id: string;
  source: string;
  mu: number[];
  y: number[];
  withCovariates: { statistic: number; p: number };
  interceptFormula: { statistic: number; p: number };
}

export interface RefPmfCase {
  mu: number;
  theta: number;
  y: number[];
  dpois: number[];
  ppois: number[];
  dnbinom: number[];
  pnbinom: number[];
}

export interface ZeroReference {
  source: Record<string, string>;
  tolerance: Record<string, number>;
  fits: RefFit[];
  vuong: RefVuong[];
  scoreTests: RefScore[];
  pmf: { source: string; tolerance: number; cases: RefPmfCase[] };
}

export const reference: ZeroReference = JSON.parse(readFileSync(resolve(DIR, 'zero-fits.json'), 'utf8'));

export function referenceFit(id: string): RefFit {
  const f = reference.fits.find((x) => x.id === id);
  if (!f) throw new Error(`no reference fit ${id}`);
  return f;
}

/** Model data (response, designs, offset) for a reference spec, built as fitZeroModel builds it. */
export function referenceModelData(f: RefFit): ZeroModelData {
  const table = bioChemists();
  const spec = parseModelSpec(f.spec);
  const kind = zeroModelKind(spec.distribution)!;
  const frame = modelFrame(table, frameOptions(spec));
  const X = buildDesign(table, spec.predictors, { intercept: true, rows: frame.rows }).design;
  const Z = buildDesign(table, spec.zeroPredictors, { intercept: true, rows: frame.rows }).design;
  return { zero: kind.zero, count: kind.count, y: frame.y, X, Z, offset: frame.offset };
}

/** The reference parameter vector [count, zero, log(theta)?] in our order. */
export function referenceParameters(f: RefFit): Float64Array {
  return Float64Array.from([...f.count.map((c) => c.estimate), ...f.zero.map((c) => c.estimate), ...(f.theta === null ? [] : [Math.log(f.theta)])]);
}

/** pscl's bioChemists as written by make-zero.R (plus the invented exposure column). */
export function bioChemists(): DataTable {
  const lines = readFileSync(resolve(DIR, 'bioChemists.csv'), 'utf8').trim().split(/\r?\n/);
  const header = lines[0].split(',');
  return tableFromTexts(header, lines.slice(1).map((l) => l.split(',')));
}

/** R coefficient names to ours: (Intercept) -> intercept, femWomen -> fem=Women ... */
export function ourTermName(rName: string): string {
  if (rName === '(Intercept)') return 'intercept';
  const m = /^(fem|mar)(.+)$/.exec(rName);
  return m ? `${m[1]}=${m[2]}` : rName;
}

/** Relative difference, or absolute when the reference is near zero. */
export function relOrAbs(ours: number, ref: number): number {
  const d = Math.abs(ours - ref);
  return Math.abs(ref) < 1e-2 ? d : d / Math.abs(ref);
}
