// Grid benchmark: first render and filter times of the Records grid at
// 200,000 records in Chromium (prints numbers; not a test).
//
//   npx electron-vite build        # the renderer under out/renderer
//   node bench/grid/run.mjs [records]
//
// The TypeScript is bundled with esbuild into bench/output/grid/ (ignored by
// git); the bench workbook is written there once per size.
import { build } from 'esbuild';
import { execFileSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '../..');
const out = join(root, 'bench/output/grid');
const records = process.argv.find((a) => /^\d+$/.test(a)) ?? '200000';
mkdirSync(out, { recursive: true });
await build({
  entryPoints: [join(here, 'measure.ts')],
  // two folders below the root, as the harness finds the built renderer from its own folder
  outfile: join(root, 'bench/output/grid-measure.cjs'),
  bundle: true,
  platform: 'node',
  format: 'cjs',
  target: 'node20',
  alias: { '@shared': join(root, 'src-shared') },
  external: ['playwright-core', 'exceljs', 'fflate', 'zod', 'saxes'],
  logLevel: 'warning',
});
execFileSync(process.execPath, [join(root, 'bench/output/grid-measure.cjs'), records, out], { stdio: 'inherit', cwd: root });
