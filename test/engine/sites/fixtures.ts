/** Loading of the site-effect reference fixtures (test/reference/sites, made by make-sites.R). */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { DataTable } from '@shared/data/table';
import { columnFromTexts } from '@shared/data/table';

const dir = resolve(__dirname, '../../reference/sites');

export interface RefCoefficient {
  term: string;
  rTerm: string;
  estimate: number;
  se: number;
}

export interface RefCase {
  name: string;
  dataset: string;
  source: string;
  spec: unknown;
  coefficients: RefCoefficient[];
  logLikelihood: number;
  logLikIntegrate?: number;
  deviance?: number;
  theta?: number | Record<string, never>;
  sd?: number;
  modes?: number[];
  modeLevels?: string[];
  /** Fixed cases: sites R found with only zero counts, and the row count with them. */
  zeroSites?: string[];
  nobsAll?: number;
  tolerance: Record<string, number>;
}

interface RefFile {
  versions: Record<string, string>;
  cases: RefCase[];
}

function read<T>(name: string): T {
  return JSON.parse(readFileSync(resolve(dir, name), 'utf8')) as T;
}

const data = read<{ datasets: Record<string, { source: string; columns: Record<string, string[]> }> }>('sites-data.json');

export function dataset(name: string): DataTable {
  const cols = data.datasets[name].columns;
  const columns = Object.entries(cols).map(([k, texts]) => columnFromTexts(k, texts));
  return { nrows: columns[0].texts.length, columns };
}

export const fixedCases = read<RefFile>('sites-fixed.json');
export const randomCases = read<RefFile>('sites-random.json');

/** theta from a fixture (R's NULL arrives as {}). */
export function refTheta(c: RefCase): number | null {
  return typeof c.theta === 'number' ? c.theta : null;
}

/** |a - b| <= tol * max(1, |b|). */
export function close(a: number, b: number, tol: number): boolean {
  return Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));
}
