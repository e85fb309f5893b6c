import { resolve } from 'node:path';
import { builtinModules } from 'node:module';
import { defineConfig } from 'vite';
import pkg from './package.json' with { type: 'json' };

// The command line: one Node bundle (plus its worker) run by bin/tallywise
// with plain Node, no Electron and no display.
const deps = Object.keys((pkg as { dependencies?: Record<string, string> }).dependencies ?? {});
const external = [...builtinModules, ...builtinModules.map((m) => `node:${m}`)];

export default defineConfig({
  resolve: { alias: { '@shared': resolve(__dirname, 'src-shared') } },
  build: {
    outDir: 'out/cli',
    emptyOutDir: true,
    ssr: true,
    target: 'node20',
    minify: false,
    sourcemap: true,
    rollupOptions: {
      input: {
        tallywise: resolve(__dirname, 'bin/cli/main.ts'),
        'fit-worker': resolve(__dirname, 'bin/cli/worker/fit-worker.ts'),
      },
      external: (id) => external.includes(id) || deps.some((d) => id === d || id.startsWith(`${d}/`)),
      output: { format: 'es', entryFileNames: '[name].mjs' },
    },
  },
});
