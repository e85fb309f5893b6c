import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CliIO } from '../../bin/cli/command';
import { main } from '../../bin/cli/main';
import type { GroupLine } from '@shared/worker/group-lines';
import type { FitSummary } from '@shared/model/fit-result';

// `tallywise fit --by/--shard/--jobs` and `tallywise merge`, run in-process
// through main(). Reference values: datasets::warpbreaks split by tension,
// breaks ~ wool per group, from stats::glm (poisson) and MASS::glm.nb
// (negbin), R 4.2.2 / MASS 7.3.58.2, made by
// test/reference/batch/make-warpbreaks-by-tension.R.

interface RefCoef {
  term: string;
  estimate: number;
  se: number;
}
interface Ref {
  tolerance: Record<'estimate' | 'se' | 'logLikelihood' | 'aic' | 'theta', number>;
  data: { breaks: string[]; wool: string[]; tension: string[] };
  groups: Record<string, { poisson: { coefficients: RefCoef[]; logLikelihood: number; aic: number; nobs: number }; negbin: { coefficients: RefCoef[]; logLikelihood: number; aic: number; theta: number; nobs: number } }>;
}

const root = resolve(__dirname, '../..');
const ref = JSON.parse(readFileSync(join(root, 'test/reference/batch/warpbreaks-by-tension.json'), 'utf8')) as Ref;

function collect(): CliIO & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { stdout, stderr, out: (t) => stdout.push(t), err: (t) => stderr.push(t) };
}

/** |a - b| / max(1, |b|) <= tol, as the fixture's tolerances are stated. */
function near(a: number, b: number, tol: number, what: string): void {
  expect(Math.abs(a - b) / Math.max(1, Math.abs(b)), `${what}: ${a} vs ${b}`).toBeLessThanOrEqual(tol);
}

/** Checks one group's fit against R: coefficients, SEs, log-likelihood, AIC (and theta for negbin). */
function checkAgainstR(line: GroupLine, model: 'poisson' | 'negbin'): void {
  const r = ref.groups[line.group][model];
  const f = fitOf(line);
  const g = `${line.group} ${model}`;
  expect(f.nobs).toBe(r.nobs);
  near(f.logLikelihood!, r.logLikelihood, ref.tolerance.logLikelihood, `${g} logLik`);
  near(f.aic!, r.aic, ref.tolerance.aic, `${g} aic`);
  if (model === 'negbin') near(f.theta!, ref.groups[line.group].negbin.theta, ref.tolerance.theta, `${g} theta`);
  expect(f.coefficients.map((c) => c.term)).toEqual(r.coefficients.map((c) => c.term));
  f.coefficients.forEach((c, k) => {
    near(c.estimate, r.coefficients[k].estimate, ref.tolerance.estimate, `${g} ${c.term}`);
    near(c.se, r.coefficients[k].se, ref.tolerance.se, `${g} se ${c.term}`);
  });
}

let dir = '';
const file = (name: string) => join(dir, name);
const lines = (io: { stdout: string[] }) => io.stdout.map((l) => JSON.parse(l) as GroupLine);
const fitOf = (l: GroupLine): FitSummary => {
  if (!('fit' in l)) throw new Error(`group ${l.group} failed: ${l.error.message}`);
  return l.fit;
};

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-fit-batch-'));
  const rows = ref.data.breaks.map((b, i) => `${b},${ref.data.wool[i]},${ref.data.tension[i]}`);
  writeFileSync(file('warpbreaks.csv'), ['breaks,wool,tension', ...rows].join('\n') + '\n');
  // Constructed faults after the 54 reference rows: a group "X" (data rows
  // 55-58) whose second row has a negative count, and a row with no tension (data row 59).
  writeFileSync(file('with-faults.csv'), ['breaks,wool,tension', ...rows, '3,A,X', '-1,B,X', '4,A,X', '5,B,X', '20,A,'].join('\n') + '\n');
  const spec = (distribution: string) => JSON.stringify({ response: 'breaks', distribution, predictors: [{ column: 'wool', type: 'factor' }] });
  writeFileSync(file('poisson.json'), spec('poisson'));
  writeFileSync(file('negbin.json'), spec('negbin'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const fitArgs = (spec: string, data = 'warpbreaks.csv') => ['fit', '--data', file(data), '--spec', file(spec), '--by', 'tension'];

describe('fit --by', () => {
  it('fits each group and matches R glm per group (poisson; datasets::warpbreaks, stats::glm)', async () => {
    const io = collect();
    expect(await main([...fitArgs('poisson.json'), '--jobs', '0'], io)).toBe(0);
    const got = lines(io);
    expect(got.map((l) => l.group).sort()).toEqual(['H', 'L', 'M']);
    for (const l of got) checkAgainstR(l, 'poisson');
    expect(io.stderr.filter((t) => /^\[\d\/3\] [HLM]: converged/.test(t))).toHaveLength(3);
  });

  it('negative binomial per group matches MASS::glm.nb (theta, coefficients, SEs, log-likelihood)', async () => {
    const io = collect();
    expect(await main([...fitArgs('negbin.json'), '--jobs', '0'], io)).toBe(0);
    expect(lines(io)).toHaveLength(3);
    for (const l of lines(io)) checkAgainstR(l, 'negbin');
  });

  it('a group that cannot be fitted gets an error line naming the whole-table row; the others still fit; exit 1', async () => {
    const io = collect();
    expect(await main([...fitArgs('poisson.json', 'with-faults.csv'), '--jobs', '0'], io)).toBe(1);
    const got = lines(io);
    expect(got.map((l) => l.group).sort()).toEqual(['H', 'L', 'M', 'X']);
    const x = got.find((l) => l.group === 'X')!;
    expect('error' in x && x.error.name).toBe('FitInputError');
    // row 2 of group X is data row 56 of the file (common practice: rows named as the user sees them)
    expect('error' in x && x.error.message).toMatch(/in the whole table they are data row 56\b/);
    expect(got.filter((l) => 'fit' in l && l.fit.converged)).toHaveLength(3);
    expect(io.stderr.join('\n')).toMatch(/1 row has a blank "tension".*data row 59\b/);
  });

  it('--shard i/n: shards are disjoint, cover every group, and follow positions in the sorted group list', async () => {
    // sorted groups: H (0), L (1), M (2); shard 1/2 takes positions 0 and 2, shard 2/2 position 1
    const groupsOf = async (shard: string) => {
      const io = collect();
      expect(await main([...fitArgs('poisson.json'), '--jobs', '0', '--shard', shard], io)).toBe(0);
      writeFileSync(file(`shard-${shard.replace('/', '-of-')}.jsonl`), io.stdout.join('\n') + '\n');
      return lines(io).map((l) => l.group).sort();
    };
    expect(await groupsOf('1/2')).toEqual(['H', 'M']);
    expect(await groupsOf('2/2')).toEqual(['L']);
    expect(await groupsOf('3/3')).toEqual(['M']);
    const empty = collect();
    expect(await main([...fitArgs('poisson.json'), '--jobs', '0', '--shard', '4/5'], empty)).toBe(0);
    expect(empty.stdout).toEqual([]);
    expect(empty.stderr.join(' ')).toMatch(/holds no group/);
  });

  it('bad usage exits 2 with a sentence naming the option', async () => {
    const cases: [string[], RegExp][] = [
      [['--shard', '0/2'], /--shard takes I\/N/],
      [['--shard', '3/2'], /--shard takes I\/N/],
      [['--shard', 'half'], /--shard takes I\/N/],
      [['--jobs', 'many'], /--jobs takes a whole number/],
    ];
    for (const [extra, message] of cases) {
      const io = collect();
      expect(await main([...fitArgs('poisson.json'), ...extra], io), extra.join(' ')).toBe(2);
      expect(io.stderr.join('\n')).toMatch(message);
    }
    const noBy = collect();
    expect(await main(['fit', '--data', file('warpbreaks.csv'), '--spec', file('poisson.json'), '--shard', '1/2'], noBy)).toBe(2);
    expect(noBy.stderr.join('\n')).toMatch(/--shard goes with --by/);
    const missing = collect();
    expect(await main(['fit', '--data', file('warpbreaks.csv'), '--spec', file('poisson.json'), '--by', 'species'], missing)).toBe(2);
    expect(missing.stderr.join('\n')).toMatch(/no column "species" to group by.*"breaks", "wool", "tension"/);
    const inSpec = collect();
    expect(await main(['fit', '--data', file('warpbreaks.csv'), '--spec', file('poisson.json'), '--by', 'wool'], inSpec)).toBe(2);
    expect(inSpec.stderr.join('\n')).toMatch(/"wool" is a column of the model spec/);
    writeFileSync(file('habitat.json'), JSON.stringify({ response: 'breaks', distribution: 'poisson', predictors: [{ column: 'habitat', type: 'factor' }] }));
    const specColumn = collect();
    expect(await main(['fit', '--data', file('warpbreaks.csv'), '--spec', file('habitat.json'), '--by', 'tension'], specColumn)).toBe(2);
    expect(specColumn.stderr.join('\n')).toMatch(/spec uses the column "habitat", which the data file does not have/);
    expect(specColumn.stdout).toEqual([]);
    expect([...noBy.stderr, ...missing.stderr, ...inSpec.stderr, ...specColumn.stderr].join('\n')).not.toMatch(/\n\s+at /);
  });
});

describe('merge', () => {
  beforeAll(async () => {
    // the shard files of the test above may not exist when this block runs alone
    for (const shard of ['1/2', '2/2']) {
      const io = collect();
      await main([...fitArgs('poisson.json'), '--jobs', '0', '--shard', shard], io);
      writeFileSync(file(`shard-${shard.replace('/', '-of-')}.jsonl`), io.stdout.join('\n') + '\n');
    }
  });

  it('joins shard outputs sorted by group, equal to the unsharded run', async () => {
    const whole = collect();
    await main([...fitArgs('poisson.json'), '--jobs', '0'], whole);
    const io = collect();
    expect(await main(['merge', file('shard-2-of-2.jsonl'), file('shard-1-of-2.jsonl'), '--data', file('warpbreaks.csv'), '--by', 'tension'], io)).toBe(0);
    expect(lines(io).map((l) => l.group)).toEqual(['H', 'L', 'M']);
    const byGroup = new Map(lines(whole).map((l) => [l.group, l]));
    for (const l of lines(io)) expect(l).toEqual(byGroup.get(l.group));
  });

  it('refuses a missing expected group, a duplicate and an unreadable line, naming file and line; exit 2', async () => {
    writeFileSync(file('expect.txt'), 'H\nL\nM\n');
    const missing = collect();
    expect(await main(['merge', file('shard-1-of-2.jsonl'), '--expect', file('expect.txt')], missing)).toBe(2);
    expect(missing.stderr.join('\n')).toMatch(/1 expected group is missing: "L"/);
    expect(missing.stdout).toEqual([]);

    const dup = collect();
    expect(await main(['merge', file('shard-1-of-2.jsonl'), file('shard-2-of-2.jsonl'), file('shard-1-of-2.jsonl')], dup)).toBe(2);
    expect(dup.stderr.join('\n')).toMatch(/Group "[HM]" is in shard-1-of-2\.jsonl line \d and again in shard-1-of-2\.jsonl line \d/);
    expect(dup.stdout).toEqual([]);

    writeFileSync(file('broken.jsonl'), '{"group":"H","fit":{"converged":true}}\n{"group": "L", "fit":\n');
    const broken = collect();
    expect(await main(['merge', file('broken.jsonl')], broken)).toBe(2);
    expect(broken.stderr.join('\n')).toMatch(/broken\.jsonl line 2 is not a JSON line/);

    const extra = collect();
    writeFileSync(file('expect-two.txt'), 'H\nM\n');
    expect(await main(['merge', file('shard-1-of-2.jsonl'), file('shard-2-of-2.jsonl'), '--expect', file('expect-two.txt')], extra)).toBe(2);
    expect(extra.stderr.join('\n')).toMatch(/1 group is not in expect-two\.txt: "L"/);
  });

  it('exit 1 when a merged group failed', async () => {
    const io = collect();
    await main([...fitArgs('poisson.json', 'with-faults.csv'), '--jobs', '0'], io);
    writeFileSync(file('faults.jsonl'), io.stdout.join('\n'));
    const merged = collect();
    expect(await main(['merge', file('faults.jsonl')], merged)).toBe(1);
    expect(merged.stderr.join('\n')).toMatch(/could not be fitted: "X"/);
  });
});

describe('fit --by on real worker threads', () => {
  const built = join(root, 'out/cli/fit-worker.mjs');
  beforeAll(() => {
    // The worker thread runs the built bundle; build it when it is not there.
    if (!existsSync(built)) execFileSync('npx', ['vite', 'build', '--config', 'vite.cli.config.ts'], { cwd: root, stdio: 'pipe' });
  }, 180_000);

  // The built bundle may be older than the source under test, so the check
  // is against R (as above), not digit-for-digit against the in-process run.
  it('fits every group on two worker threads, matching MASS::glm.nb per group', async () => {
    const io = collect();
    expect(await main([...fitArgs('negbin.json'), '--jobs', '2'], io)).toBe(0);
    expect(io.stderr[0]).toMatch(/on 2 worker threads/);
    expect(lines(io).map((l) => l.group).sort()).toEqual(['H', 'L', 'M']);
    for (const l of lines(io)) checkAgainstR(l, 'negbin');
  });
});
