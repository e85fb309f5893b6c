import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildDemo } from '@shared/demo/build';
import { DEFAULT_DEMO_SEED, DEMO_TRUTH } from '@shared/demo/truth';
import { plantedMarkdown, truthJson, truthMarkdown } from '@shared/demo/truth-report';

/**
 * resources/demo/README.md holds two generated sections, each between
 * `<!-- generated:NAME -->` and `<!-- /generated:NAME -->`; truth.json is
 * generated whole. These functions give their current contents so a test can
 * check the committed files and, on request, rewrite them.
 */
export const GENERATED_SECTIONS = ['truth', 'planted'] as const;
export type GeneratedSection = (typeof GENERATED_SECTIONS)[number];

export function generatedSection(name: GeneratedSection, seed: number = DEFAULT_DEMO_SEED): string {
  return name === 'truth' ? truthMarkdown(DEMO_TRUTH) : plantedMarkdown(buildDemo(seed).planted);
}

export function truthJsonText(seed: number = DEFAULT_DEMO_SEED): string {
  return `${JSON.stringify(truthJson(DEMO_TRUTH, seed), null, 2)}\n`;
}

const markers = (name: string) => [`<!-- generated:${name} -->`, `<!-- /generated:${name} -->`] as const;

/** The text between a section's markers (trimmed), or null when the markers are missing. */
export function readSection(readme: string, name: GeneratedSection): string | null {
  const [open, close] = markers(name);
  const a = readme.indexOf(open);
  const b = readme.indexOf(close);
  if (a < 0 || b < a) return null;
  return readme.slice(a + open.length, b).trim();
}

/** The README with every generated section replaced by its current contents. */
export function refreshReadme(readme: string): string {
  let out = readme;
  for (const name of GENERATED_SECTIONS) {
    const [open, close] = markers(name);
    const a = out.indexOf(open);
    const b = out.indexOf(close);
    if (a < 0 || b < a) throw new Error(`The demo README has no "${open}" … "${close}" pair: add the two marker lines where the ${name} table belongs.`);
    out = `${out.slice(0, a + open.length)}\n${generatedSection(name)}\n${out.slice(b)}`;
  }
  return out;
}

/** Rewrites README.md's generated sections and truth.json in the given folder. */
export function refreshDemoResources(dir: string): void {
  const readmePath = join(dir, 'README.md');
  writeFileSync(readmePath, refreshReadme(readFileSync(readmePath, 'utf8')), 'utf8');
  writeFileSync(join(dir, 'truth.json'), truthJsonText(), 'utf8');
}
