import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { CliIO } from '../../bin/cli/command';
import { main } from '../../bin/cli/main';

// `tallywise trend` and `tallywise power` through main(), in this process
// (--jobs 0). Reference: MASS::ships (open dataset), stats::glm poisson with
// type + year of construction + offset(log(service)), R 4.2.2, from
// test/reference/trend/make-trend.R.
const ref = JSON.parse(readFileSync(join(resolve(__dirname, '../..'), 'test/reference/trend/trend-fixtures.json'), 'utf8'));
const dir = mkdtempSync(join(tmpdir(), 'tw-trend-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const ships = ref.ships.data as Record<string, (string | number)[]>;
const header = Object.keys(ships);
const csv = join(dir, 'ships.csv');
writeFileSync(csv, [header.join(','), ...ships.incidents.map((_, i) => header.map((h) => String(ships[h][i])).join(','))].join('\n'));
const specFile = (name: string, spec: object) => {
  const p = join(dir, name);
  writeFileSync(p, JSON.stringify(spec));
  return p;
};
const annual = specFile('annual.json', { response: 'incidents', distribution: 'poisson', offsets: [{ column: 'service', log: true }], site: { column: 'type', effect: 'fixed' }, time: { column: 'year', trend: 'annual' } });

function collect(): CliIO & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return { stdout, stderr, out: (t) => stdout.push(t), err: (t) => stderr.push(t) };
}
async function run(...argv: string[]) {
  const io = collect();
  const status = await main(argv, io);
  return { status, out: io.stdout.join('\n'), err: io.stderr.join('\n') };
}

describe('tallywise trend', () => {
  it('--json prints fit, indices and slope as the contract defines (values from stats::glm on MASS::ships)', async () => {
    const r = await run('trend', '--data', csv, '--spec', annual, '--json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(Object.keys(j).slice(0, 3)).toEqual(['fit', 'indices', 'slope']);
    expect(Object.keys(j.slope)).toEqual(['perYear', 'lower', 'upper']);
    expect(j.fit.distribution).toBe('poisson');
    expect(j.indices[0]).toEqual({ time: 60, index: 100, lower: 100, upper: 100 });
    j.indices.forEach((row: { time: number; index: number; lower: number; upper: number }, i: number) => {
      const want = ref.ships.poisson.indices[i];
      expect(Object.keys(row)).toEqual(['time', 'index', 'lower', 'upper']);
      expect(Math.abs(row.index - want.index) / want.index).toBeLessThan(1e-4);
      expect(Math.abs(row.upper - want.upper) / want.upper).toBeLessThan(1e-4);
    });
    expect(Math.abs(j.slope.perYear - ref.ships.poisson.slope.perYear)).toBeLessThan(1e-5);
  });

  it('the text form shows indices, the trend and the decision flags with the caution', async () => {
    const r = await run('trend', '--data', csv, '--spec', annual, '--change', '60-65:70-75');
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/Indices \(base 60 = 100\)/);
    expect(r.out).toMatch(/Change from 60-65 to 70-75/);
    expect(r.out).toMatch(/not a Red List assessment/);
  });

  it('--flags adds the flags object; --base rescales', async () => {
    const j = JSON.parse((await run('trend', '--data', csv, '--spec', annual, '--json', '--flags', '--base', '70', '--horizon', '5')).out);
    expect(j.flags.horizon).toBe(5);
    expect(j.indices.find((r: { time: number }) => r.time === 70)).toMatchObject({ index: 100, lower: 100, upper: 100 });
  });

  it('bad usage and bad input are named, with exit status 2 and no stack trace', async () => {
    const noTime = specFile('notime.json', { response: 'incidents', distribution: 'poisson' });
    const a = await run('trend', '--data', csv, '--spec', noTime);
    expect(a.status).toBe(2);
    expect(a.err).toMatch(/no "time" entry/);
    const b = await run('trend', '--data', csv, '--spec', annual, '--limits', 'jackknife');
    expect(b.status).toBe(2);
    expect(b.err).toMatch(/--limits takes wald, robust or bootstrap/);
    const c = await run('trend', '--data', csv, '--spec', annual, '--base', '1999');
    expect(c.status).toBe(2);
    expect(c.err).toMatch(/1999 is not a value of "year".*60, 65, 70, 75/);
    expect(c.err).not.toMatch(/\n\s+at /);
    const d = await run('trend', '--data', csv, '--spec', annual, '--change', '60-65');
    expect(d.err).toMatch(/two periods/);
  });

  it('--limits bootstrap runs, records its method and seed', async () => {
    // The seeded grid of the fixture (18 sites); MASS::ships has only 5 ship types to resample.
    const g = ref.simulated.data as Record<string, (string | number)[]>;
    const gh = Object.keys(g);
    const gridCsv = join(dir, 'grid.csv');
    writeFileSync(gridCsv, [gh.join(';'), ...g.count.map((_, i) => gh.map((h) => String(g[h][i])).join(';'))].join('\n'));
    const gridSpec = specFile('grid.json', { response: 'count', distribution: 'negbin', offsets: [{ column: 'effort' }], site: { column: 'site', effect: 'fixed' }, time: { column: 'season', trend: 'linear' } });
    const r = await run('trend', '--data', gridCsv, '--spec', gridSpec, '--json', '--limits', 'bootstrap', '--replicates', '20', '--seed', '2', '--jobs', '0');
    expect(r.err).not.toMatch(/could not|Only/);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.method).toMatchObject({ replicates: 20, seed: 2 });
    expect(r.err).toMatch(/bootstrap refits/);
  });
});

describe('tallywise trend --by --composite', () => {
  it('prints one trend per group and the composite with bootstrap limits', async () => {
    // Seeded simulation: two species on the same 10 sites (src-shared/trend/power-simulation.ts).
    const { simulateProgramme } = await import('@shared/trend/power-simulation');
    const lines = ['site,season,count,species'];
    [-0.05, 0.03].forEach((annualChange, k) => {
      const t = simulateProgramme({ sites: 10, seasons: 5, visits: 2, meanCount: 5, theta: 3, siteSd: 0.3, annualChange, alpha: 0.05 }, 40 + k);
      for (let i = 0; i < t.nrows; i++) lines.push(`${t.columns[0].texts[i]},${t.columns[1].texts[i]},${t.columns[2].texts[i]},sp${k + 1}`);
    });
    const data = join(dir, 'two.csv');
    writeFileSync(data, lines.join('\n'));
    const spec = specFile('two.json', { response: 'count', distribution: 'negbin', site: { column: 'site', effect: 'fixed' }, time: { column: 'season', trend: 'annual' } });
    const r = await run('trend', '--data', data, '--spec', spec, '--by', 'species', '--composite', '--replicates', '20', '--weights', 'sp1=2,sp2=1', '--jobs', '0', '--json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.groups.map((g: { group: string }) => g.group)).toEqual(['sp1', 'sp2']);
    expect(j.composite.weights).toEqual({ sp1: 2, sp2: 1 });
    expect(j.composite.replicates).toBe(20);
    const i = 4;
    const want = Math.exp((2 * Math.log(j.groups[0].indices[i].index) + Math.log(j.groups[1].indices[i].index)) / 3);
    expect(j.composite.indices[i].index).toBeCloseTo(want, 8);
    const bad = await run('trend', '--data', data, '--spec', spec, '--composite');
    expect(bad.status).toBe(2);
    expect(bad.err).toMatch(/add --by/);
  });
});

describe('tallywise power', () => {
  it('prints a table over sites x seasons with Monte-Carlo SEs, and the Wald approximation for Poisson', async () => {
    const r = await run('power', '--sites', '6,12', '--seasons', '5', '--visits', '1', '--mean-count', '4', '--theta', 'none', '--site-sd', '0', '--change', '-0.08', '--replicates', '30', '--jobs', '0', '--json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.cells.map((c: { sites: number }) => c.sites)).toEqual([6, 12]);
    for (const c of j.cells) {
      expect(c.mcse).toBeCloseTo(Math.sqrt((c.power * (1 - c.power)) / c.replicates), 12);
      expect(c.analyticPoisson).toBeGreaterThan(0);
    }
  });
  it('refuses an impossible design with the value named', async () => {
    const r = await run('power', '--sites', '1', '--jobs', '0');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/number of sites/);
  });
});
