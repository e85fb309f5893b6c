/**
 * Site effects at scale: negative binomial site x season fits with fixed
 * (absorbed) and random (Laplace and 9-node adaptive quadrature) site
 * effects on invented grids of 300 x 20, 2,000 x 25 and 5,000 x 30
 * site-seasons with 20% missing. Each of our cases runs in a child process
 * (its peak RSS is reported). R's MASS::glm.nb with a dense site factor is
 * timed on 300 x 20 (and on 2,000 x 25 with --r-large: about 1 GB of
 * memory); glmmTMB (when installed) on the random Laplace cases up to
 * 2,000 x 25, lme4::glmer.nb on 300 x 20 (2,000 x 25 with --r-large).
 * Ratios are of CPU times (R's user + system against ours), which are less
 * distorted by other load than wall times.
 * See bench/sites/README.md.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { makeGrid } from './grid';

const here = dirname(fileURLToPath(import.meta.url));
const rLarge = process.argv.includes('--r-large');
const sizes: [number, number][] = [
  [300, 20],
  [2000, 25],
  [5000, 30],
];
const MISSING = 0.2;
const R_TIMEOUT_MS = 600_000;

interface Ours {
  ms: number;
  cpuMs: number;
  rssMb: number;
  logLik: number;
  theta: number;
  sd: number | null;
  converged: boolean;
}

function ours(kind: string, s: number, t: number): Ours {
  const out = execFileSync(process.execPath, [join(here, 'run-case.mjs'), kind, String(s), String(t), String(MISSING)], { encoding: 'utf8' });
  return JSON.parse(out.trim().split('\n').pop()!) as Ours;
}

function hasRscript(): boolean {
  try {
    execFileSync('Rscript', ['--version'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

interface RTime {
  /** Elapsed seconds, and CPU seconds (user + system) of the fit. */
  s: number;
  cpu: number;
  ll: number;
  th: number;
  /** True when R did not finish within R_TIMEOUT_MS (s is then the limit). */
  timedOut: boolean;
}

/** Runs R code on the CSV; the code sets `tm` (system.time of the fit), `ll` and `th`. Null when R fails. */
function timeR(code: string, csv: string): RTime | null {
  const script = `suppressPackageStartupMessages({library(MASS); library(lme4)})
d <- read.csv("${csv}"); d$season <- factor(d$season); d$site <- factor(d$site)
${code}
cat(sprintf("%.4f %.4f %.6f %.6f\\n", tm[["elapsed"]], tm[["user.self"]] + tm[["sys.self"]], ll, th))`;
  try {
    const out = execFileSync('Rscript', ['-e', script], { encoding: 'utf8', timeout: R_TIMEOUT_MS, stdio: ['ignore', 'pipe', 'ignore'] });
    const [s, cpu, ll, th] = out.trim().split('\n').pop()!.split(' ').map(Number);
    return { s, cpu, ll, th, timedOut: false };
  } catch (e) {
    const err = e as { signal?: string; code?: string };
    if (err.signal === 'SIGTERM' || err.code === 'ETIMEDOUT') return { s: R_TIMEOUT_MS / 1000, cpu: NaN, ll: NaN, th: NaN, timedOut: true };
    return null;
  }
}

const R_DENSE = `tm <- system.time(m <- glm.nb(count ~ season + cover + offset(log(effort)) + site, data = d)); ll <- as.numeric(logLik(m)); th <- m$theta`;
const R_GLMER_NB = `tm <- system.time(m <- glmer.nb(count ~ season + cover + offset(log(effort)) + (1 | site), data = d)); ll <- as.numeric(logLik(m)); th <- getME(m, "glmer.nb.theta")`;
const R_TMB = `suppressPackageStartupMessages(library(glmmTMB)); tm <- system.time(m <- glmmTMB(count ~ season + cover + offset(log(effort)) + (1 | site), family = nbinom2, data = d)); ll <- as.numeric(logLik(m)); th <- sigma(m)`;

const withR = hasRscript();
const dir = mkdtempSync(join(tmpdir(), 'tw-bench-sites-'));
const rows: string[] = [];
const fmt = (x: number | null | undefined, d = 2) => (x === null || x === undefined || !Number.isFinite(x) ? '-' : x.toFixed(d));
/** R's time and the ratio R / ours ("> limit" when R timed out). */
const rCell = (r: RTime | null, o: Ours) =>
  !r
    ? '-'
    : r.timedOut
      ? `> ${fmt(r.s, 0)} s wall`
      : `${fmt(r.s)} s wall, CPU ${fmt(r.cpu)} s (CPU ratio ${fmt(r.cpu / (o.cpuMs / 1000), 1)}x, dLogLik ${fmt(o.logLik - r.ll, 4)})`;
const oursCell = (o: Ours) => `ours ${fmt(o.ms / 1000, 3)} s (CPU ${fmt(o.cpuMs / 1000, 3)} s)  RSS ${fmt(o.rssMb, 0)} MB`;
for (const [s, t] of sizes) {
  const grid = makeGrid(s, t, MISSING);
  const csv = join(dir, `grid-${s}x${t}.csv`);
  writeFileSync(csv, grid.csv);
  const label = `${s} x ${t} (${grid.table.nrows} rows)`;
  const fixed = ours('fixed', s, t);
  const dense = withR && (s <= 300 || (rLarge && s <= 2000)) ? timeR(R_DENSE, csv) : null;
  rows.push(
    `${label.padEnd(26)} fixed    ${oursCell(fixed)}  | R glm.nb dense ${rCell(dense, fixed)}`,
  );
  console.log(rows[rows.length - 1]);
  for (const kind of ['random', 'random9']) {
    const r = ours(kind, s, t);
    const lapl = kind === 'random';
    // glmer.nb needs minutes already at 300 x 20; larger grids only with --r-large.
    const glmerNb = withR && lapl && (s <= 300 || (rLarge && s <= 2000)) ? timeR(R_GLMER_NB, csv) : null;
    const tmb = withR && lapl && s <= 2000 ? timeR(R_TMB, csv) : null;
    rows.push(
      `${label.padEnd(26)} ${lapl ? 'random1' : 'random9'}  ${oursCell(r)}  | glmer.nb ${rCell(glmerNb, r)}  glmmTMB ${rCell(tmb, r)}`,
    );
    console.log(rows[rows.length - 1]);
  }
}
