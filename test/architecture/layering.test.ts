import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { builtinModules } from 'node:module';
import { describe, expect, it } from 'vitest';

// The layering rules of DESIGN.md, checked on the source text: src-shared is
// pure (no electron, Node built-ins, DOM or React), and src-main and
// src-renderer never import each other.

const root = resolve(__dirname, '../..');

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sourceFiles(p));
    else if (/\.(ts|tsx|mts)$/.test(name)) out.push(p);
  }
  return out;
}

/** Module specifiers of import/export-from statements and dynamic imports. */
export function importsOf(text: string): string[] {
  const specs: string[] = [];
  const re = /(?:import|export)\s+(?:type\s+)?(?:[^'"`;]*?\s+from\s+)?['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|require\(\s*['"]([^'"]+)['"]\s*\)/g;
  for (const m of text.matchAll(re)) specs.push(m[1] ?? m[2] ?? m[3]);
  return specs;
}

const nodeBuiltins = new Set([...builtinModules, ...builtinModules.map((m) => `node:${m}`)]);
const domGlobals = /\b(document|window|localStorage|sessionStorage|navigator|HTMLElement)\s*[.[(]/;

function resolvesInto(file: string, spec: string, dir: string): boolean {
  if (spec.startsWith('.')) return resolve(file, '..', spec).startsWith(resolve(root, dir));
  return false;
}

describe('layering (DESIGN.md)', () => {
  it('the import scanner sees the forms we use', () => {
    expect(importsOf("import { a } from 'x';\nimport type { B } from \"y\";\nexport * from './z';\nconst m = await import('w');")).toEqual([
      'x',
      'y',
      './z',
      'w',
    ]);
  });

  const shared = sourceFiles(join(root, 'src-shared'));
  it('src-shared has source files to check', () => {
    expect(shared.length).toBeGreaterThan(3);
  });

  for (const file of shared) {
    const rel = relative(root, file);
    it(`${rel} is pure`, () => {
      const text = readFileSync(file, 'utf8');
      const bad = importsOf(text).filter(
        (s) => s === 'electron' || s.startsWith('electron/') || nodeBuiltins.has(s) || s === 'react' || s.startsWith('react-dom') || s.startsWith('react/') || resolvesInto(file, s, 'src-main') || resolvesInto(file, s, 'src-renderer'),
      );
      expect(bad, `${rel} imports ${bad.join(', ')}; src-shared must stay free of Electron, Node, React and the other layers`).toEqual([]);
      const code = text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/\/\/.*$/gm, '');
      expect(domGlobals.test(code), `${rel} uses a DOM global`).toBe(false);
    });
  }

  it('src-main never imports src-renderer, and src-renderer never imports src-main, Node or Electron', () => {
    const faults: string[] = [];
    for (const file of sourceFiles(join(root, 'src-main'))) {
      for (const s of importsOf(readFileSync(file, 'utf8'))) if (resolvesInto(file, s, 'src-renderer')) faults.push(`${relative(root, file)} -> ${s}`);
    }
    for (const file of sourceFiles(join(root, 'src-renderer'))) {
      for (const s of importsOf(readFileSync(file, 'utf8'))) {
        if (resolvesInto(file, s, 'src-main') || s === 'electron' || nodeBuiltins.has(s)) faults.push(`${relative(root, file)} -> ${s}`);
      }
    }
    expect(faults).toEqual([]);
  });
});
