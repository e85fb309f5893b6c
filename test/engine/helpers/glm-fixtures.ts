/** Loads the R reference fits of test/reference/glm (made by make-glm.R). */
import type { DataTable } from '@shared/data/table';
import { tableFromTexts } from '@shared/data/table';
import type { ModelSpec } from '@shared/model/spec';
import { parseModelSpec } from '@shared/model/spec';
import raw from '../../reference/glm/glm-fixtures.json';

export interface RefCoef {
  term: string;
  estimate: number;
  se: number;
  z: number;
  p: number;
}

export interface RefFit {
  name: string;
  source: string;
  call: string;
  data: Record<string, (string | number)[]>;
  spec: unknown;
  allZeroSites?: string[];
  expected: {
    coefficients: RefCoef[];
    nobs: number;
    dfResidual: number;
    deviance: number;
    nullDeviance: number;
    pearsonChi2: number;
    logLik: number | null;
    aic: number | null;
    bic: number | null;
    df: number | null;
    dispersion: number | null;
    theta: number | null;
    thetaSe: number | null;
    robust?: { cluster: string; se: { term: string; se: number }[] };
  };
}

interface FixtureFile {
  R: string;
  packages: Record<string, string>;
  fixtures: Record<string, RefFit>;
  lrNested: { source: string; statistic: number; df: number; p: number };
  lrNegbinPoisson: { source: string; statistic: number; p: number };
  boundary: { source: string; spec: unknown; rTheta: number | null; ships: { source: string; rTheta: number; rLogLik: number } };
  ns: { source: string; x: number[]; xNew: number[]; knots: number[]; boundary: number[]; basis: number[][]; basisDf1: number[] };
}

export const glmFixtures = raw as unknown as FixtureFile;

export function fixture(name: string): RefFit {
  const f = glmFixtures.fixtures[name];
  if (!f) throw new Error(`no fixture ${name}`);
  return f;
}

/** The fixture's data as a table of cell texts, as a CSV would give it. */
export function fixtureTable(f: { data: Record<string, (string | number)[]> }): DataTable {
  const cols = Object.keys(f.data);
  const n = f.data[cols[0]].length;
  const rows = Array.from({ length: n }, (_, i) => cols.map((c) => String(f.data[c][i])));
  return tableFromTexts(cols, rows);
}

export function fixtureSpec(f: RefFit, change: Partial<ModelSpec> = {}): ModelSpec {
  return { ...parseModelSpec(f.spec), ...change };
}

/** |a - b| / max(|b|, floor). */
export function relErr(a: number, b: number, floor = 1e-8): number {
  return Math.abs(a - b) / Math.max(Math.abs(b), floor);
}
