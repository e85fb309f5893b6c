import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { GENERATED_SECTIONS, generatedSection, readSection, refreshDemoResources, refreshReadme, truthJsonText } from '../../src-main/demo/demo-resources';
import { buildDemo } from '@shared/demo/build';
import { PROGRAMME_NAME } from '@shared/demo/programme';
import { DEFAULT_DEMO_SEED, DEMO_TRUTH } from '@shared/demo/truth';

const DIR = join(__dirname, '../../resources/demo');

// TW_UPDATE_DEMO=1 rewrites the generated files first (after a deliberate change to the truth or the mess plan).
if (process.env.TW_UPDATE_DEMO === '1') refreshDemoResources(DIR);

const readme = readFileSync(join(DIR, 'README.md'), 'utf8');

describe('resources/demo stays in step with the code', () => {
  it('truth.json equals what truth.ts gives', () => {
    const committed = JSON.parse(readFileSync(join(DIR, 'truth.json'), 'utf8'));
    expect(committed).toEqual(JSON.parse(truthJsonText()));
    expect(committed.seed).toBe(DEFAULT_DEMO_SEED);
    expect(committed.species.map((s: { key: string; annualChange: number }) => [s.key, s.annualChange])).toEqual(DEMO_TRUTH.species.map((s) => [s.key, s.annualChange]));
  });

  it.each(GENERATED_SECTIONS)('README section "%s" equals its generated table', (name) => {
    expect(readSection(readme, name)).toBe(generatedSection(name));
  });

  it('README names the programme, says it is invented and gives the seed', () => {
    expect(readme).toContain(PROGRAMME_NAME);
    expect(readme).toMatch(/invented/i);
    expect(readme).toContain(String(DEFAULT_DEMO_SEED));
  });

  it('README lists every planted problem of the default seed by cell', () => {
    const section = readSection(readme, 'planted')!;
    for (const p of buildDemo(DEFAULT_DEMO_SEED).planted) expect(section).toContain(`| ${p.season} | ${p.kind} | ${p.sheet}!${p.column}${p.row} |`);
  });

  it('refreshing a README replaces only the generated parts and reports missing markers plainly', () => {
    const stale = readme.replace(readSection(readme, 'truth')!, '| stale |');
    const fresh = refreshReadme(stale);
    expect(fresh).toBe(refreshReadme(readme));
    expect(readSection(fresh, 'truth')).toBe(generatedSection('truth'));
    expect(() => refreshReadme('# no markers')).toThrow(/marker lines/);
  });
});
