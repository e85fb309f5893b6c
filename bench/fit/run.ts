/**
 * Fit speed: Tallywise's engine against R on the same synthetic data.
 * See bench/fit/README.md for how to run it. Prints a table; asserts nothing.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import { tableFromTexts } from '../../src-shared/data/table';
import { fitCountGlm } from '../../src-shared/engine/count-fit';
import { gamma, poisson, rng } from '../../test/engine/helpers/simulate';
import { solveSpd, weightedCrossprod } from '../../src-shared/engine/linalg/dense';
import { parseModelSpec } from '../../src-shared/model/spec';

const REPEATS = 3;
/** Warm-up: at least this many runs and this many seconds, so that the timed runs see compiled code, not the compiler. */
const WARM_RUNS = 10;
const WARM_SECONDS = 1;

/** n rows: 8 numeric predictors, 2 factors (3 and 4 levels), effort offset; NB2 counts with theta 2. */
function synthetic(n: number): { header: string[]; rows: string[][] } {
  const u = rng(n);
  const header = ['count', 'effort', 'x1', 'x2', 'x3', 'x4', 'x5', 'x6', 'x7', 'x8', 'f1', 'f2'];
  const b = [0.3, -0.2, 0.1, 0.05, -0.15, 0.25, -0.05, 0.12];
  const rows: string[][] = [];
  for (let i = 0; i < n; i++) {
    const x = b.map(() => u() * 2 - 1);
    const f1 = Math.floor(u() * 3);
    const f2 = Math.floor(u() * 4);
    const effort = 0.5 + u() * 3;
    let eta = 0.4 + Math.log(effort) + 0.2 * f1 - 0.1 * f2;
    x.forEach((v, k) => (eta += b[k] * v));
    const y = poisson(u, Math.exp(eta) * (gamma(u, 2, 1) / 2));
    rows.push([String(y), effort.toFixed(4), ...x.map((v) => v.toFixed(5)), `a${f1}`, `b${f2}`]);
  }
  return { header, rows };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, c) => a - c);
  return s[Math.floor(s.length / 2)];
}

interface Timing {
  /** Elapsed seconds. */
  wall: number;
  /** CPU seconds of this process (user + system): what matters on a shared machine. */
  cpu: number;
}

function timeIt(f: () => void): Timing {
  const w0 = performance.now();
  for (let k = 0; k < WARM_RUNS || performance.now() - w0 < WARM_SECONDS * 1000; k++) f();
  const walls: number[] = [];
  const cpus: number[] = [];
  for (let r = 0; r < REPEATS; r++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    f();
    walls.push((performance.now() - t0) / 1000);
    const c = process.cpuUsage(c0);
    cpus.push((c.user + c.system) / 1e6);
  }
  return { wall: median(walls), cpu: median(cpus) };
}

function rTimes(csv: string): Record<'poisson' | 'negbin', Timing> | null {
  try {
    const out = execFileSync('Rscript', [resolve(__dirname ?? '.', 'fit-times.R'), csv, String(REPEATS)], { encoding: 'utf8' });
    return JSON.parse(out.trim().split('\n').pop()!);
  } catch {
    return null;
  }
}

const spec = (distribution: 'poisson' | 'negbin') =>
  parseModelSpec({
    response: 'count',
    distribution,
    predictors: [
      ...['x1', 'x2', 'x3', 'x4', 'x5', 'x6', 'x7', 'x8'].map((column) => ({ column, type: 'numeric' })),
      { column: 'f1', type: 'factor' },
      { column: 'f2', type: 'factor' },
    ],
    offsets: [{ column: 'effort', log: true }],
  });

const dir = mkdtempSync(join(tmpdir(), 'tallywise-bench-'));
console.log('Fit speed: 8 numeric + 2 factor predictors (p = 14 with intercept), log-effort offset.');
console.log(`Median of ${REPEATS} runs after a warm-up (ours: ${WARM_RUNS} runs and ${WARM_SECONDS} s at least); ours includes model frame and design.\n`);
console.log('rows     model     ours wall / cpu (s)   R wall / cpu (s)   ratio (cpu)   iterations');
const f3 = (v: number) => v.toFixed(3).padStart(6);
for (const n of [10_000, 100_000]) {
  const { header, rows } = synthetic(n);
  const csv = join(dir, `fit-${n}.csv`);
  writeFileSync(csv, [header.join(','), ...rows.map((r) => r.join(','))].join('\n'));
  const table = tableFromTexts(header, rows);
  const r = rTimes(csv);
  for (const dist of ['poisson', 'negbin'] as const) {
    let iterations = 0;
    const ours = timeIt(() => {
      iterations = fitCountGlm(table, spec(dist)).summary.iterations;
    });
    const rt = r ? r[dist] : null;
    console.log(
      `${String(n).padEnd(8)} ${dist.padEnd(8)}  ${f3(ours.wall)} / ${f3(ours.cpu)}      ${rt ? `${f3(rt.wall)} / ${f3(rt.cpu)}` : '      n/a      '}    ${rt ? (ours.cpu / rt.cpu).toFixed(2).padStart(8) : '     n/a'}     ${iterations}`,
    );
  }
}
console.log(`(machine load average now: ${loadavg().map((v) => v.toFixed(1)).join(' ')})`);

// The solve step: own Jacobi-scaled Cholesky against ml-matrix's CholeskyDecomposition.
{
  const n = 2000;
  const p = 14;
  const u = rng(3);
  const x = Float64Array.from({ length: n * p }, () => u());
  const w = Float64Array.from({ length: n }, () => 0.5 + u());
  const a = weightedCrossprod(x, n, p, w);
  const b = Float64Array.from({ length: p }, () => u());
  const reps = 20_000;
  const own = timeIt(() => {
    for (let k = 0; k < reps; k++) solveSpd(a, p, b, true);
  });
  const rows2d = Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => a[j * p + i]));
  const ml = timeIt(() => {
    for (let k = 0; k < reps; k++) {
      const chol = new CholeskyDecomposition(new Matrix(rows2d));
      chol.solve(Matrix.columnVector(Array.from(b)));
      chol.solve(Matrix.eye(p));
    }
  });
  console.log(`\nSolve and invert a ${p} x ${p} system ${reps} times (CPU s): own Cholesky ${own.cpu.toFixed(3)}, ml-matrix ${ml.cpu.toFixed(3)} (ml-matrix / own = ${(ml.cpu / own.cpu).toFixed(1)}).`);
}
