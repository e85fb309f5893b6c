import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { channelNames, commandChannel, progressChannel } from '@shared/host/channels';

// A sandboxed preload can require only Electron; anything else fails when the
// window opens, which no Node test would notice. Check the built bundle.
const bundle = resolve(__dirname, '../../out/preload/index.cjs');

describe('the built preload', () => {
  it('exists (npm test builds before it tests)', () => {
    expect(existsSync(bundle), 'run `npm run build` first').toBe(true);
  });
  it('requires nothing but electron and names every channel', () => {
    const text = readFileSync(bundle, 'utf8');
    const required = [...text.matchAll(/require\(\s*["']([^"']+)["']\s*\)/g)].map((m) => m[1]);
    expect(required).toEqual(['electron']);
    for (const c of channelNames) expect(text).toContain(JSON.stringify(c));
    // The two channels main sends on: host commands and jobs' progress.
    for (const c of [commandChannel, progressChannel]) expect(text).toContain(JSON.stringify(c));
    expect(text).toMatch(/exposeInMainWorld\(/);
    expect(text).not.toMatch(/ipcRenderer\.send\(|require\(["']fs/);
  });
});
